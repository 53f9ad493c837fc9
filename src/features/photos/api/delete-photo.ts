import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client';
import { photoApiPaths } from './keys';

/** DELETE /api/banks/:bankId/photos/:photoId (grower) → 204; the stored images go too. */
export async function deletePhoto(bankId: string, photoId: string): Promise<void> {
  await apiFetch(photoApiPaths.photo(bankId, photoId), { method: 'DELETE' });
}

export function useDeletePhoto(bankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (photoId: string) => deletePhoto(bankId, photoId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['banks', bankId] }),
  });
}
