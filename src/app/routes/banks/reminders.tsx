import { Link } from 'react-router-dom';
import { Card } from '#src/components/ui/card';
import { PageHeader } from '#src/components/ui/page-header';
import { paths } from '#src/config/paths';
import { useMe } from '#src/features/auth/api/get-me';
import { CalendarSubscribe } from '#src/features/calendar/components/calendar-subscribe';
import { ReminderChoices } from '#src/features/reminders/components/reminder-choices';
import { useRouteBank } from './use-route-bank';

/** /banks/:bankId/reminders — Account → Reminders: the signed-in member's e-mails about this bank. */
export function RemindersPage() {
  const { bank } = useRouteBank();
  const me = useMe().data;
  const otherBanks = me?.memberships.filter((m) => m.bankId !== bank.id) ?? [];

  return (
    <div className="mx-auto w-full max-w-3xl">
      <PageHeader
        eyebrow="Account"
        title="Reminders"
        description="Which e-mails Hilum sends you about this bank. Each switch saves at once."
      />
      <div className="grid gap-6">
        <Card title={bank.name}>
          <ReminderChoices
            bankId={bank.id}
            bankName={bank.name}
            timeZone={bank.timeZone}
            email={me?.user.email}
          />
        </Card>
        <Card
          id="calendar"
          title="Subscribe in your calendar app"
          description={`${bank.name}’s sowing plan and tray check days, kept up to date.`}
        >
          <CalendarSubscribe bankId={bank.id} />
        </Card>
        {otherBanks.length > 0 ? (
          <Card title="Your other banks" description="Each bank has its own choices.">
            <ul className="grid gap-1">
              {otherBanks.map((m) => (
                <li key={m.bankId}>
                  <Link
                    to={paths.reminders.getHref(m.bankId)}
                    className="inline-flex min-h-11 items-center font-semibold text-moss-800 underline"
                  >
                    Reminders in {m.bankName}
                  </Link>
                </li>
              ))}
            </ul>
          </Card>
        ) : null}
      </div>
    </div>
  );
}
