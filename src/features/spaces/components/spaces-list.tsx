import { useState } from 'react';
import type { GrowingSpaceDto } from '#shared/schemas/spaces';
import { Button } from '#src/components/ui/button';
import { ConfirmDialog } from '#src/components/ui/confirm-dialog';
import { useDeleteSpace } from '../api/save-space';
import { SpaceForm } from './space-form';
import { capacityWords } from './space-words';

function SpaceRow({ bankId, space, canEdit }: { bankId: string; space: GrowingSpaceDto; canEdit: boolean }) {
  const [editing, setEditing] = useState(false);
  const [confirming, setConfirming] = useState(false);
  const remove = useDeleteSpace(bankId, space.id);
  if (editing)
    return (
      <li className="rounded-lg border border-loam-200 p-3">
        <SpaceForm
          bankId={bankId}
          space={space}
          onDone={() => setEditing(false)}
          onCancel={() => setEditing(false)}
        />
      </li>
    );
  return (
    <li className="flex flex-wrap items-center justify-between gap-2 border-b border-loam-100 py-2 last:border-b-0">
      <div className="min-w-0">
        <p className="break-words font-semibold text-loam-900">{space.name}</p>
        <p className="num text-sm text-loam-700">{capacityWords(space)}</p>
      </div>
      {canEdit ? (
        <div className="flex gap-2">
          <Button variant="secondary" onClick={() => setEditing(true)} aria-label={`Change ${space.name}`}>
            Change
          </Button>
          <Button variant="quiet" onClick={() => setConfirming(true)} aria-label={`Remove ${space.name}`}>
            Remove
          </Button>
          <ConfirmDialog
            open={confirming}
            title={`Remove ${space.name}?`}
            confirmLabel="Remove"
            destructive
            isPending={remove.isPending}
            error={remove.error?.message}
            onConfirm={() => remove.mutate(undefined, { onSuccess: () => setConfirming(false) })}
            onCancel={() => setConfirming(false)}
          >
            <p>The plan’s room under the lights will no longer count it.</p>
          </ConfirmDialog>
        </div>
      ) : null}
    </li>
  );
}

/** The bank's growing spaces, each changeable by growers, and a form to add one. */
export function SpacesList({
  bankId,
  spaces,
  canEdit,
}: {
  bankId: string;
  spaces: readonly GrowingSpaceDto[];
  canEdit: boolean;
}) {
  const [adding, setAdding] = useState(false);
  return (
    <div className="grid gap-3">
      {spaces.length ? (
        <ul aria-label="Growing spaces">
          {spaces.map((s) => (
            <SpaceRow key={s.id} bankId={bankId} space={s} canEdit={canEdit} />
          ))}
        </ul>
      ) : (
        <p className="text-loam-700">
          No growing spaces recorded yet.{' '}
          {canEdit
            ? 'Add the shelves or boxes you grow seedlings in under lights.'
            : 'A grower or owner adds them.'}
        </p>
      )}
      {canEdit ? (
        adding || spaces.length === 0 ? (
          <SpaceForm
            bankId={bankId}
            onDone={() => setAdding(false)}
            onCancel={spaces.length ? () => setAdding(false) : undefined}
          />
        ) : (
          <div>
            <Button variant="secondary" onClick={() => setAdding(true)}>
              Add a space
            </Button>
          </div>
        )
      ) : null}
    </div>
  );
}
