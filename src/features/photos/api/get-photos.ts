import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { photoSchema } from '#shared/schemas/lots';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths, type PhotoSubject } from '#src/lib/bank-api';

const photosResponseSchema = z.object({ items: z.array(photoSchema) });

/** GET /api/banks/:bankId/{lots|plants}/:id/photos, oldest first. */
export async function getPhotos(
  bankId: string,
  subject: PhotoSubject,
  subjectId: string,
  { signal }: { signal?: AbortSignal } = {},
) {
  return (
    await apiFetch(bankPaths.photos(bankId, subject, subjectId), { schema: photosResponseSchema, signal })
  ).items;
}

export function photosQueryOptions(bankId: string, subject: PhotoSubject, subjectId: string) {
  return queryOptions({
    queryKey: bankKeys.photosOf(bankId, subject, subjectId),
    queryFn: ({ signal }) => getPhotos(bankId, subject, subjectId, { signal }),
  });
}

export function usePhotos(bankId: string, subject: PhotoSubject, subjectId: string) {
  return useQuery(photosQueryOptions(bankId, subject, subjectId));
}
