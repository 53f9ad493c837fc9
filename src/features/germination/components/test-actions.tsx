import { useState } from 'react';
import type { TestDetail } from '../../../../shared/schemas/germination';
import { Button } from '../../../components/ui/button';
import { ConfirmDialog } from '../../../components/ui/confirm-dialog';
import { FormAlert } from '../../../components/ui/form-alert';
import { useDeleteTest } from '../api/delete-test';
import { useReopenTest } from '../api/reopen-test';
import { FinishDialog } from './finish-dialog';
import { formatDate } from './format';

export interface TestActionsProps {
  bankId: string;
  detail: TestDetail;
  today: string;
  onDeleted: () => void | Promise<void>;
}

/** Finish, reopen and delete: for growers only (the page leaves this out for viewers). */
export function TestActions({ bankId, detail, today, onDeleted }: TestActionsProps) {
  const { test } = detail;
  const reopen = useReopenTest(bankId, test.id);
  const remove = useDeleteTest(bankId, test.id);
  const [finishing, setFinishing] = useState(false);
  const [deleting, setDeleting] = useState(false);
  const [notice, setNotice] = useState<string>();

  return (
    <section aria-labelledby="test-actions-title" className="rounded-xl border border-loam-200 bg-white p-4 sm:p-5">
      <h2 id="test-actions-title" className="text-lg font-bold text-loam-900">
        {test.status === 'running' ? 'When the last check is done' : 'This test is finished'}
      </h2>
      <div aria-live="polite" className="empty:hidden mt-2">
        {notice ? <FormAlert tone="success">{notice}</FormAlert> : null}
        <FormAlert>{reopen.error?.message}</FormAlert>
      </div>
      <div className="mt-3 flex flex-col gap-2 sm:flex-row sm:flex-wrap">
        {test.status === 'running' ? (
          <Button onClick={() => setFinishing(true)} disabled={detail.counts.length === 0}>
            Finish the test…
          </Button>
        ) : (
          <Button
            variant="secondary"
            isLoading={reopen.isPending}
            onClick={() => reopen.mutate(undefined, { onSuccess: () => setNotice('Reopened: counts can be changed again.') })}
          >
            Reopen to change counts
          </Button>
        )}
        <Button variant="secondary" className="text-clay-800" onClick={() => setDeleting(true)}>
          Delete this test…
        </Button>
      </div>
      {test.status === 'running' && detail.counts.length === 0 ? (
        <p className="mt-2 text-sm text-loam-600">A test can be finished after its first count.</p>
      ) : null}

      <FinishDialog
        bankId={bankId}
        detail={detail}
        open={finishing}
        today={today}
        onClose={() => setFinishing(false)}
        onFinished={() => {
          setFinishing(false);
          setNotice('Finished. The result is final unless you reopen the test.');
        }}
      />
      <ConfirmDialog
        open={deleting}
        title="Delete this test?"
        confirmLabel="Delete the test"
        destructive
        isPending={remove.isPending}
        error={remove.error?.message}
        onCancel={() => setDeleting(false)}
        onConfirm={() => remove.mutate(undefined, { onSuccess: () => onDeleted() })}
      >
        The test started {formatDate(test.startDate)} and its counts and tray photos are removed.{' '}
        {test.seedsTaken > 0
          ? `Its ${test.seedsTaken} seeds go back into lot ${test.lotCode}’s stock.`
          : `It took no seeds from lot ${test.lotCode}’s stock (it came in with a file of past tests), so the stock stays as it is.`}{' '}
        Use this for a test entered by mistake.
      </ConfirmDialog>
    </section>
  );
}
