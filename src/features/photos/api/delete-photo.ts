import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiFetch } from '#src/lib/api-client';
import { bankPaths, refresh, stale, type PhotoSubject } from '#src/lib/bank-api';

/** DELETE /api/banks/:bankId/photos/:photoId (grower) → 204; the stored images go too. */
export async function deletePhoto(bankId: string, photoId: string): Promise<void> {
  await apiFetch(bankPaths.photo(bankId, photoId), { method: 'DELETE' });
}

export function useDeletePhoto(bankId: string, subject: PhotoSubject, subjectId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (photoId: string) => deletePhoto(bankId, photoId),
    onSuccess: () => refresh(queryClient, stale.photos(bankId, subject, subjectId)),
  });
}
