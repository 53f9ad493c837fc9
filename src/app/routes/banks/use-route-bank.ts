import { useSuspenseQuery } from '@tanstack/react-query';
import { useParams } from 'react-router-dom';
import { bankQueryOptions } from '#src/features/banks/api/get-bank';

/** The bank of the current `/banks/:bankId/…` page; its loader has already fetched it. */
export function useRouteBank() {
  const { bankId } = useParams();
  if (!bankId) throw new Error('useRouteBank is used outside a /banks/:bankId route');
  return useSuspenseQuery(bankQueryOptions(bankId)).data;
}
