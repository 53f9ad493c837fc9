import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiFetch } from '#src/lib/api-client';

// TODO(shared): move to shared/ once the server's outbox schema lives there.
export const outboxMessageSchema = z.object({
  id: z.string(),
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  date: z.string(),
  text: z.string(),
  html: z.string().nullable(),
});

export const outboxSchema = z.object({
  items: z.array(outboxMessageSchema),
});

export type OutboxMessage = z.infer<typeof outboxMessageSchema>;
export type Outbox = z.infer<typeof outboxSchema>;

export const devMailKeys = {
  all: ['dev-mail'] as const,
  outbox: () => [...devMailKeys.all, 'outbox'] as const,
};

/** GET /dev/outbox: e-mail captured by the local SMTP fake, newest first. */
export function getOutbox({ signal }: { signal?: AbortSignal } = {}): Promise<Outbox> {
  return apiFetch('/dev/outbox', { schema: outboxSchema, signal });
}

export function outboxQueryOptions() {
  return queryOptions({
    queryKey: devMailKeys.outbox(),
    queryFn: ({ signal }) => getOutbox({ signal }),
    staleTime: 0,
    // Poll while the page is open so a freshly sent message shows up; stop once the server is gone.
    refetchInterval: (query) => (query.state.status === 'error' ? false : 5_000),
  });
}

export function useOutbox() {
  return useQuery(outboxQueryOptions());
}
