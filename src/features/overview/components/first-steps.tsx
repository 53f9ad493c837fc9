import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { buttonStyles } from '#src/components/ui/button';
import { Card } from '#src/components/ui/card';
import { paths } from '#src/config/paths';
import { cn } from '#src/lib/cn';

export interface FirstStepsProps {
  bankId: string;
  canEdit: boolean;
  isOwner: boolean;
  hasLots: boolean;
  frostDateSet: boolean;
  hasAssays: boolean;
  /** A lot to test first, when the bank has one. */
  lotToAssay?: { lotId: string; code: string } | undefined;
}

interface Step {
  key: string;
  done: boolean;
  title: string;
  text: string;
  action?: ReactNode;
}

/** For a bank that is just starting: the three things that make the rest of Hilum work. */
export function FirstSteps({
  bankId,
  canEdit,
  isOwner,
  hasLots,
  frostDateSet,
  hasAssays,
  lotToAssay,
}: FirstStepsProps) {
  const steps: Step[] = [
    {
      key: 'lot',
      done: hasLots,
      title: 'Log your first lot',
      text: 'A packet or jar of seed: species, variety, where it came from and roughly how many seeds.',
      action: canEdit ? (
        <Link to={paths.newLot.getHref(bankId)} className={buttonStyles()}>
          Log a lot
        </Link>
      ) : undefined,
    },
    {
      key: 'frost',
      done: frostDateSet,
      title: 'Set your last frost date',
      text: isOwner
        ? 'The planner counts sowing days back from it. Your local extension service or garden club knows the usual date.'
        : 'The planner counts sowing days back from it; the bank’s owner sets it in Settings.',
      action: (
        <Link to={paths.settings.getHref(bankId)} className={buttonStyles({ variant: 'secondary' })}>
          {isOwner ? 'Set the frost date' : 'See the settings'}
        </Link>
      ),
    },
    {
      key: 'test',
      done: hasAssays,
      title: 'Start a germination test',
      text: `Sow a counted sample on a damp paper towel or a tray, and count the healthy seedlings on each check day.${
        hasLots ? '' : ' Start it from the lot’s page once the lot is logged.'
      }`,
      action:
        canEdit && lotToAssay ? (
          <Link
            to={paths.newAssay.getHref(bankId, lotToAssay.lotId)}
            className={buttonStyles({ variant: 'secondary' })}
          >
            Test {lotToAssay.code}
          </Link>
        ) : canEdit && hasLots ? (
          <Link to={paths.lots.getHref(bankId)} className={buttonStyles({ variant: 'secondary' })}>
            Choose a lot
          </Link>
        ) : undefined,
    },
  ];
  return (
    <Card
      title="Getting started"
      description="Three steps and this page fills with what needs doing each week."
    >
      <ol className="grid gap-4">
        {steps.map((step, index) => (
          <li key={step.key} className="flex gap-3">
            <span
              aria-hidden="true"
              className={cn(
                'num flex size-8 shrink-0 items-center justify-center rounded-full font-bold',
                step.done ? 'bg-moss-600 text-white' : 'bg-seedcoat-100 text-seedcoat-800',
              )}
            >
              {step.done ? '✓' : index + 1}
            </span>
            <div className="grid min-w-0 gap-2">
              <div>
                <p className="font-semibold text-loam-900">
                  {step.title}
                  {step.done ? <span className="font-normal text-moss-800"> · done</span> : null}
                </p>
                <p className="text-loam-700">{step.text}</p>
              </div>
              {!step.done && step.action ? <div>{step.action}</div> : null}
            </div>
          </li>
        ))}
      </ol>
    </Card>
  );
}
