import { queryOptions, useQuery } from '@tanstack/react-query';
import { packetPageStateSchema } from '#shared/schemas/packet';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths } from '#src/lib/bank-api';

/** GET …/lots/:lotId/packet-page: the lot's public packet page address, or null while it is off. */
export async function getPacketPage(
  bankId: string,
  lotId: string,
  { signal }: { signal?: AbortSignal } = {},
) {
  return (await apiFetch(bankPaths.lotPacketPage(bankId, lotId), { schema: packetPageStateSchema, signal }))
    .url;
}

export const packetPageQueryOptions = (bankId: string, lotId: string) =>
  queryOptions({
    queryKey: bankKeys.lotPacketPage(bankId, lotId),
    queryFn: ({ signal }) => getPacketPage(bankId, lotId, { signal }),
  });

export const usePacketPage = (bankId: string, lotId: string) =>
  useQuery(packetPageQueryOptions(bankId, lotId));
