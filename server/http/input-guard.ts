/**
 * Rules every request's input obeys before any router sees it, each in this one place:
 * - a request body is UTF-8 (RFC 8259 §8.1): a `charset` other than utf-8 is a 415;
 * - no text holds a NUL character (U+0000), which PostgreSQL cannot store in text and no person
 *   types: a NUL anywhere in the JSON body (values or keys) or the query string is a 400 naming
 *   the field.
 * Multipart uploads are read later by multer (see multipart.ts); CSV files refuse NUL themselves
 * (csv-file.ts). Path ids are uuids, so a NUL there is already a 404 (params.ts).
 */
import type { RequestHandler } from 'express';
import { AppError, badRequest } from './errors';

const CHARSET = /;\s*charset\s*=\s*"?([^";\s]*)"?/i;
const UTF8 = new Set(['utf-8', 'utf8']);

/** A 415 for a request body declared in any charset but UTF-8. */
export const requireUtf8: RequestHandler = (req, _res, next) => {
  const charset = CHARSET.exec(req.get('content-type') ?? '')?.[1];
  if (charset === undefined || UTF8.has(charset.toLowerCase())) return next();
  const named = charset === '' ? 'an empty charset' : `charset "${charset.slice(0, 40)}"`;
  next(
    new AppError(
      415,
      'unsupported_charset',
      `Send the request body as UTF-8 (Content-Type: application/json; charset=utf-8); ${named} is not supported.`,
    ),
  );
};

const NUL = '\u0000';

/**
 * The paths ("trays.0.notes", "q") of the strings, and object keys, that hold a NUL, in order;
 * '_' for the value itself. Walks with its own stack, as a body may nest deeper than the call
 * stack allows.
 */
export function nulPaths(value: unknown): string[] {
  const found: string[] = [];
  const stack: { value: unknown; path: string[] }[] = [{ value, path: [] }];
  while (stack.length > 0 && found.length < 20) {
    const { value: v, path } = stack.pop()!;
    if (typeof v === 'string') {
      if (v.includes(NUL)) found.push(path.length ? path.join('.') : '_');
    } else if (Array.isArray(v)) {
      for (let i = v.length - 1; i >= 0; i--) stack.push({ value: v[i], path: [...path, String(i)] });
    } else if (v !== null && typeof v === 'object') {
      const entries = Object.entries(v);
      for (let i = entries.length - 1; i >= 0; i--) {
        const [key, inner] = entries[i]!;
        const at = [...path, key.replaceAll(NUL, '\\u0000')];
        if (key.includes(NUL)) found.push(at.join('.'));
        else stack.push({ value: inner, path: at });
      }
    }
  }
  return found;
}

function nulRefused(where: 'body' | 'query', paths: string[]): AppError {
  const named = paths
    .map((p) => (p === '_' ? `the ${where === 'body' ? 'request body' : 'query'}` : `"${p}"`))
    .join(', ');
  return badRequest(
    `Text in Hilum cannot contain a NUL character (\\u0000); remove it from ${named} and try again.`,
    Object.fromEntries(paths.map((p) => [p, 'Remove the NUL character (\\u0000).'])),
  );
}

/** A 400 naming the fields when the JSON body or the query string holds a NUL character. */
export const refuseNul: RequestHandler = (req, _res, next) => {
  const inQuery = nulPaths(req.query);
  if (inQuery.length > 0) return next(nulRefused('query', inQuery));
  const inBody = nulPaths(req.body);
  if (inBody.length > 0) return next(nulRefused('body', inBody));
  next();
};
