import { idSchema } from '#shared/schemas/common';
import { notFound } from './errors';

/** A path id; a malformed one is simply a record that does not exist (404). */
export function idParam(value: unknown, what = 'record'): string {
  const parsed = idSchema.safeParse(value);
  if (!parsed.success) throw notFound(`No such ${what}.`);
  return parsed.data;
}
