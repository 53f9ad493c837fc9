import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiFetch, isApiError } from '#src/lib/api-client';

// TODO(shared): move to shared/ once the server's health schema lives there, and import it here.
const partStateSchema = z.enum(['up', 'down']);

export const healthSchema = z.object({
  ok: z.boolean(),
  database: partStateSchema,
  objectStore: partStateSchema,
  mail: partStateSchema,
  environment: z.string().optional(),
});

export type Health = z.infer<typeof healthSchema>;
export type HealthPart = 'database' | 'objectStore' | 'mail';

export const healthKeys = {
  all: ['health'] as const,
};

/** GET /api/health. A 503 still reports which part is down, so it resolves with that report. */
export async function getHealth({ signal }: { signal?: AbortSignal } = {}): Promise<Health> {
  try {
    return await apiFetch('/api/health', { schema: healthSchema, signal });
  } catch (error) {
    if (isApiError(error) && error.status === 503) {
      const report = healthSchema.safeParse(error.body);
      if (report.success) return report.data;
    }
    throw error;
  }
}

export function healthQueryOptions() {
  return queryOptions({
    queryKey: healthKeys.all,
    queryFn: ({ signal }) => getHealth({ signal }),
    refetchInterval: 60_000,
    retry: 1,
  });
}

export function useHealth() {
  return useQuery(healthQueryOptions());
}

/** True when the server says it is not running in production (the dev mailbox exists there). */
export function isNonProduction(health: Health | undefined): boolean {
  return typeof health?.environment === 'string' && health.environment !== 'production';
}
