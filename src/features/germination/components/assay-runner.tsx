import { useState } from 'react';
import type { AssayDetail } from '#shared/schemas/germination';
import { Card } from '#src/components/ui/card';
import { FormAlert } from '#src/components/ui/form-alert';
import { SelectField } from '#src/components/ui/select-field';
import { Spinner } from '#src/components/ui/spinner';
import { useUpdateAssay } from '../api/update-assay';

export interface AssayRunnerProps {
  bankId: string;
  detail: AssayDetail;
  /** The owners and growers the test can be handed to; undefined while they are read. */
  candidates: { userId: string; name: string }[] | undefined;
  /** A grower or owner, while the test runs, may hand it on. */
  canChange: boolean;
}

/** Who runs the test (its check-day reminders go to them), and handing it to someone else. */
export function AssayRunner({ bankId, detail, candidates, canChange }: AssayRunnerProps) {
  const update = useUpdateAssay(bankId, detail.test.id);
  const [status, setStatus] = useState<string>();
  const [error, setError] = useState<string>();
  const { runnerId, runnerName } = detail.test;
  const current = candidates?.some((c) => c.userId === runnerId) ? runnerId : '';

  const handTo = async (userId: string) => {
    setStatus(undefined);
    setError(undefined);
    try {
      const next = await update.mutateAsync({ runnerId: userId });
      setStatus(`Saved: ${next.test.runnerName ?? 'the new runner'} runs this test now.`);
    } catch (e) {
      setError(e instanceof Error ? e.message : 'The change was not saved. Try again.');
    }
  };

  return (
    <Card title="Who runs this test">
      <div className="grid gap-3">
        <p className="text-loam-700" data-testid="assay-runner">
          {runnerName ? (
            <>
              Run by <span className="font-semibold text-loam-900">{runnerName}</span>: the tray check-day
              reminders go to them alone, and not on a day whose counts are already saved.
            </>
          ) : (
            'Nobody runs this test now: its check-day reminders go to the bank’s owners.'
          )}
        </p>
        <FormAlert>{error}</FormAlert>
        {canChange ? (
          <div className="flex items-end gap-3">
            <SelectField
              label="Hand the test to"
              hint="An owner or grower of the bank."
              value={current ?? ''}
              disabled={candidates === undefined || update.isPending}
              onChange={(e) => {
                if (e.target.value) void handTo(e.target.value);
              }}
              containerClassName="w-full max-w-xs"
            >
              {current ? null : <option value="">Choose a member</option>}
              {candidates?.map((c) => (
                <option key={c.userId} value={c.userId}>
                  {c.name}
                </option>
              ))}
            </SelectField>
            {update.isPending ? <Spinner size="sm" label="Saving who runs the test" /> : null}
          </div>
        ) : null}
        {status ? (
          <p role="status" className="font-semibold text-moss-800">
            {status}
          </p>
        ) : null}
      </div>
    </Card>
  );
}
