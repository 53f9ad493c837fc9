import type { Response } from 'express';
import type { z } from 'zod';

/** Sends `body` through its response schema, which is the allowlist of what leaves the server. */
export function respond<S extends z.ZodType>(res: Response, status: number, schema: S, body: z.input<S>): void {
  res.status(status).json(schema.parse(body));
}
