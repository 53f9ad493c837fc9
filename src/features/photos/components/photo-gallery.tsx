import { useState } from 'react';
import type { PhotoDto } from '#shared/schemas/lots';
import { Button } from '#src/components/ui/button';
import { ConfirmDialog } from '#src/components/ui/confirm-dialog';
import { Dialog } from '#src/components/ui/dialog';
import { FormAlert } from '#src/components/ui/form-alert';
import { PhotoPicker } from '#src/components/ui/photo-picker';
import { ProgressBar } from '#src/components/ui/progress-bar';
import { Loading } from '#src/components/ui/spinner';
import { useDeletePhoto } from '../api/delete-photo';
import { usePhotos } from '../api/get-photos';
import type { PhotoSubject } from '#src/lib/bank-api';
import { isRetryable, uploadFailureMessage, useUploadPhoto } from '../api/upload-photo';

/** An upload that failed before this page opened (the new-lot form hands it over). */
export interface FailedUpload {
  file: File;
  message: string;
  /** False when sending the same file again cannot help (too large, a type the server cannot read). */
  retryable: boolean;
}

export interface PhotoGalleryProps {
  bankId: string;
  subject: PhotoSubject;
  subjectId: string;
  /** Words for the photos' alt text: "Packet of TOM-2025-01". */
  describe: (index: number) => string;
  canEdit: boolean;
  failedUpload?: FailedUpload | undefined;
}

/** Thumbnails of a lot's or plant's photos; a tap shows the full image. Growers add and delete. */
export function PhotoGallery({
  bankId,
  subject,
  subjectId,
  describe,
  canEdit,
  failedUpload,
}: PhotoGalleryProps) {
  const photos = usePhotos(bankId, subject, subjectId);
  const upload = useUploadPhoto(bankId);
  const remove = useDeletePhoto(bankId, subject, subjectId);
  const [open, setOpen] = useState<{ photo: PhotoDto; index: number } | null>(null);
  const [confirmDelete, setConfirmDelete] = useState<PhotoDto | null>(null);
  const [file, setFile] = useState<File | null>(null);
  const [progress, setProgress] = useState(0);
  // The failure handed over by the form stays until a retry succeeds or another file is chosen.
  const [failure, setFailure] = useState<FailedUpload | undefined>(failedUpload);

  const send = (chosen: File) => {
    setProgress(0);
    upload.mutate(
      { subject, subjectId, file: chosen, onProgress: setProgress },
      {
        onSuccess: () => {
          setFailure(undefined);
          setFile(null);
        },
        onError: (error) =>
          setFailure({ file: chosen, message: uploadFailureMessage(error), retryable: isRetryable(error) }),
      },
    );
  };

  const items = photos.data ?? [];

  return (
    <div className="grid gap-4">
      {failure ? (
        <FormAlert title="The photo was not saved">
          <p>{failure.message}</p>
          {failure.retryable ? (
            <div className="mt-2 flex flex-wrap gap-2">
              <Button variant="secondary" isLoading={upload.isPending} onClick={() => send(failure.file)}>
                Try the upload again
              </Button>
            </div>
          ) : canEdit ? (
            <p className="mt-1 font-normal">Choose another photo below.</p>
          ) : null}
        </FormAlert>
      ) : null}

      {photos.isPending ? (
        <Loading label="Loading the photos" />
      ) : photos.isError ? (
        <FormAlert>{photos.error.message}</FormAlert>
      ) : items.length === 0 ? (
        <p className="text-loam-700">No photos yet.</p>
      ) : (
        <ul aria-label="Photos" className="grid grid-cols-3 gap-2 sm:grid-cols-4">
          {items.map((photo, index) => (
            <li key={photo.id} className="relative">
              <button
                type="button"
                onClick={() => setOpen({ photo, index })}
                className="block aspect-square w-full overflow-hidden rounded-lg border border-loam-200 bg-loam-100"
                aria-label={`Show ${describe(index)} full size`}
              >
                <img
                  src={photo.thumbUrl}
                  alt={describe(index)}
                  loading="lazy"
                  className="size-full object-cover"
                />
              </button>
            </li>
          ))}
        </ul>
      )}

      {canEdit ? (
        <div className="grid gap-3 rounded-lg border border-dashed border-loam-300 p-3">
          <PhotoPicker
            label="Add a photo"
            hint={`JPEG, PNG, WebP or AVIF, up to 15 MB. Location data is removed before it is stored.`}
            file={file}
            disabled={upload.isPending}
            onChange={(next) => {
              setFile(next);
              upload.reset();
            }}
          />
          {upload.isPending ? <ProgressBar value={progress} label="Uploading the photo" /> : null}
          {file ? (
            <div>
              <Button isLoading={upload.isPending} onClick={() => send(file)}>
                Upload photo
              </Button>
            </div>
          ) : null}
        </div>
      ) : null}

      <Dialog
        open={open !== null}
        wide
        title={open ? describe(open.index) : ''}
        onClose={() => setOpen(null)}
        actions={
          canEdit && open ? (
            <Button
              variant="danger"
              onClick={() => {
                remove.reset();
                setConfirmDelete(open.photo);
                setOpen(null);
              }}
            >
              Delete photo
            </Button>
          ) : undefined
        }
      >
        {open ? (
          <img
            src={open.photo.url}
            alt={describe(open.index)}
            width={open.photo.width}
            height={open.photo.height}
            className="mx-auto h-auto max-h-[70dvh] w-auto max-w-full rounded-lg object-contain"
          />
        ) : null}
      </Dialog>

      <ConfirmDialog
        open={confirmDelete !== null}
        title="Delete this photo?"
        confirmLabel="Delete photo"
        destructive
        isPending={remove.isPending}
        error={remove.error?.message}
        onCancel={() => setConfirmDelete(null)}
        onConfirm={() =>
          confirmDelete && remove.mutate(confirmDelete.id, { onSuccess: () => setConfirmDelete(null) })
        }
      >
        The photo and its thumbnail are removed from the bank. This cannot be undone.
      </ConfirmDialog>
    </div>
  );
}
