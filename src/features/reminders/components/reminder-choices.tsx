import { useState } from 'react';
import { hourWords, reminderPrefsBodySchema, type ReminderPrefs } from '#shared/schemas/reminders';
import { FormAlert } from '#src/components/ui/form-alert';
import { SelectField } from '#src/components/ui/select-field';
import { Spinner } from '#src/components/ui/spinner';
import { cn } from '#src/lib/cn';
import { useReminders } from '../api/get-reminders';
import { useUpdateReminders } from '../api/update-reminders';

type Kind = Exclude<keyof ReminderPrefs, 'hour'>;

/** The hours a member may choose, midnight to 11 p.m. */
const HOURS = Array.from({ length: 24 }, (_, h) => h);

/** Each kind of reminder, with when it is sent (from the member's own hour, on the bank's clock). */
const KINDS: { kind: Kind; label: string; when: string }[] = [
  { kind: 'sowing', label: 'Sowing days', when: 'The day a sowing window of the season plan opens.' },
  {
    kind: 'checks',
    label: 'Tray check days',
    when: 'Each check day of a germination test you run, unless that day’s counts are already saved.',
  },
  { kind: 'retest', label: 'Retests', when: 'When a lot is due for a retest of its germination.' },
  {
    kind: 'digest',
    label: 'Weekly summary',
    when: 'A Monday summary of the week: sowings, counts and retests due.',
  },
];

export interface ReminderChoicesProps {
  bankId: string;
  bankName: string;
  timeZone: string;
  email: string | undefined;
}

/**
 * Four switches and the hour they are sent at; each change is saved at once, and the controls
 * show what the server kept.
 */
export function ReminderChoices({ bankId, bankName, timeZone, email }: ReminderChoicesProps) {
  const { data: prefs } = useReminders(bankId);
  const update = useUpdateReminders(bankId);
  const [saving, setSaving] = useState<Kind | 'hour'>();
  const [status, setStatus] = useState<string>();
  const [error, setError] = useState<string>();
  const zone = timeZone.replaceAll('_', ' ');

  const chooseHour = async (hour: number) => {
    setSaving('hour');
    setStatus(undefined);
    setError(undefined);
    try {
      const next = await update.mutateAsync(reminderPrefsBodySchema.parse({ hour }));
      const at = hourWords(next.hour);
      // "6 p.m." already ends the sentence; "noon" and "midnight" need the stop.
      setStatus(`Saved: reminders at ${at}${at.endsWith('.') ? '' : '.'}`);
    } catch (e) {
      setError(e instanceof Error ? e.message : 'The change was not saved. Try again.');
    } finally {
      setSaving(undefined);
    }
  };

  const toggle = async (kind: Kind, on: boolean, label: string) => {
    setSaving(kind);
    setStatus(undefined);
    setError(undefined);
    try {
      const body = reminderPrefsBodySchema.parse({ [kind]: on });
      const next = await update.mutateAsync(body);
      setStatus(`Saved: ${label.toLowerCase()} ${next[kind] ? 'on' : 'off'}.`);
    } catch (e) {
      setError(e instanceof Error ? e.message : 'The change was not saved. Try again.');
    } finally {
      setSaving(undefined);
    }
  };

  return (
    <div className="grid gap-4">
      <p className="text-loam-700">
        E-mails to <span className="font-semibold text-loam-900">{email ?? 'your address'}</span> about{' '}
        <span className="font-semibold text-loam-900">{bankName}</span>, from{' '}
        <span className="font-semibold text-loam-900">{hourWords(prefs.hour)}</span> on the bank’s clock (
        {zone}). These are your own choices; other members choose theirs.
      </p>
      <FormAlert>{error}</FormAlert>
      <div className="flex items-end gap-3">
        <SelectField
          label="Send my reminders at"
          hint={`The hour in ${zone}, the bank’s time zone.`}
          value={prefs.hour}
          disabled={saving !== undefined}
          onChange={(e) => void chooseHour(Number(e.target.value))}
          containerClassName="w-full max-w-xs"
        >
          {HOURS.map((h) => (
            <option key={h} value={h}>
              {hourWords(h)}
            </option>
          ))}
        </SelectField>
        {saving === 'hour' ? <Spinner size="sm" label="Saving the hour" /> : null}
      </div>
      <ul className="divide-y divide-loam-100 rounded-lg border border-loam-200">
        {KINDS.map(({ kind, label, when }) => {
          const on = prefs[kind];
          const id = `reminder-${kind}`;
          return (
            <li key={kind} className="flex items-center justify-between gap-4 px-3 py-3 sm:px-4">
              <div className="min-w-0">
                <label htmlFor={id} className="font-semibold text-loam-900">
                  {label}
                </label>
                <p id={`${id}-when`} className="text-sm text-loam-600">
                  {when}
                </p>
              </div>
              <div className="flex shrink-0 items-center gap-2">
                {saving === kind ? <Spinner size="sm" label={`Saving ${label.toLowerCase()}`} /> : null}
                <button
                  id={id}
                  type="button"
                  role="switch"
                  aria-checked={on}
                  aria-describedby={`${id}-when`}
                  disabled={saving !== undefined}
                  onClick={() => void toggle(kind, !on, label)}
                  // The track is 32 px high; the button around it keeps a 44 px target.
                  className="inline-flex min-h-11 min-w-14 items-center justify-center rounded-full disabled:opacity-60"
                >
                  <span
                    aria-hidden="true"
                    className={cn(
                      'relative inline-flex h-8 w-14 items-center rounded-full border-2 transition-colors',
                      on ? 'border-moss-700 bg-moss-700' : 'border-loam-400 bg-loam-200',
                    )}
                  >
                    <span
                      className={cn(
                        'inline-block size-6 rounded-full bg-white shadow transition-transform',
                        on ? 'translate-x-6' : 'translate-x-0.5',
                      )}
                    />
                  </span>
                </button>
                <span aria-hidden="true" className="w-7 text-sm font-semibold text-loam-700">
                  {on ? 'On' : 'Off'}
                </span>
              </div>
            </li>
          );
        })}
      </ul>
      {status ? (
        <p role="status" className="font-semibold text-moss-800">
          {status}
        </p>
      ) : null}
    </div>
  );
}
