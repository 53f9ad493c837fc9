import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { photoSchema } from '#shared/schemas/lots';
import { isApiError } from '#src/lib/api-client';
import { uploadWithProgress } from '#src/lib/upload';
import { bankPaths, refresh, stale, type PhotoSubject } from '#src/lib/bank-api';

const uploadedSchema = z.object({ photo: photoSchema });

/** The server's limit on one photo file (server/photos/upload.ts). */
export const MAX_PHOTO_MB = 15;

export interface UploadPhotoInput {
  subject: PhotoSubject;
  subjectId: string;
  file: File;
  onProgress?: (fraction: number) => void;
}

/**
 * POST /api/banks/:bankId/{lots|plants}/:id/photos, multipart field `photo` (grower), sent with
 * XMLHttpRequest for its upload progress. 413 too large, 415 a type the server cannot read, 503
 * photo storage down.
 */
export async function uploadPhoto(
  bankId: string,
  { subject, subjectId, file, onProgress }: UploadPhotoInput,
) {
  const body = new FormData();
  body.append('photo', file);
  const path = bankPaths.photos(bankId, subject, subjectId);
  return (await uploadWithProgress(path, { body, schema: uploadedSchema, onProgress })).photo;
}

/** The message for a failed upload, in words a grower can act on. */
export function uploadFailureMessage(error: unknown): string {
  if (!isApiError(error)) return 'The photo could not be uploaded. Try again.';
  if (error.status === 413)
    return `The photo is larger than ${MAX_PHOTO_MB} MB. Choose a smaller one, or take it again at a lower size.`;
  // 415 and 503 messages from the server already say which types work, or that storage is down.
  return error.message;
}

/** Whether sending the same file again may work (storage or the network was down), unlike a 413 or 415. */
export function isRetryable(error: unknown): boolean {
  return !isApiError(error) || !(error.status === 413 || error.status === 415 || error.status === 400);
}

export function useUploadPhoto(bankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: UploadPhotoInput) => uploadPhoto(bankId, input),
    // The subject's photos, and the lot's thumbnail or the plant's photo list that come with them.
    onSuccess: (_photo, { subject, subjectId }) =>
      refresh(queryClient, stale.photos(bankId, subject, subjectId)),
  });
}
