import type { Response } from 'express';
import type { z } from 'zod';

/** Sends `body` through its response schema, which is the allowlist of what leaves the server. */
export function respond<S extends z.ZodType>(
  res: Response,
  status: number,
  schema: S,
  body: z.input<S>,
): void {
  res.status(status).json(schema.parse(body));
}

/**
 * A body (or a list's rows, one at a time) rendered through its schema, for answers kept between
 * requests (the ranking's rows, a page of lots): the schema stays the allowlist of every byte sent.
 */
export const rowRenderer =
  <S extends z.ZodType>(schema: S) =>
  (row: z.input<S>): Buffer =>
    Buffer.from(JSON.stringify(schema.parse(row)));

/** Sends JSON text already rendered through its schemas (see rowRenderer). */
export function respondRendered(res: Response, status: number, json: Buffer): void {
  res.status(status).type('json').send(json);
}
