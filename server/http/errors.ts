import type { ErrorRequestHandler, RequestHandler } from 'express';
import type { Logger } from 'pino';
import { ZodError, type z } from 'zod';

/** An error with the HTTP status and the code the client sees; the one error handler maps it. */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: Record<string, string>,
    /** Row-level problems of a file (CSV import), listed beside the message. */
    readonly rows?: { line: number; column?: string; message: string }[],
  ) {
    super(message);
  }
}

export const badRequest = (message: string, fields?: Record<string, string>) =>
  new AppError(400, 'invalid_input', message, fields);
export const unauthorized = (message = 'Please sign in.') => new AppError(401, 'unauthenticated', message);
export const forbidden = (message = 'Your role in this bank does not allow that.') =>
  new AppError(403, 'forbidden', message);
export const notFound = (message = 'Not found.') => new AppError(404, 'not_found', message);
export const conflict = (message: string, code = 'conflict') => new AppError(409, code, message);
export const unprocessable = (message: string, fields?: Record<string, string>) =>
  new AppError(422, 'impossible', message, fields);
/** A refused CSV file (400 invalid_csv): every problem, by line, beside the message; nothing imported. */
export function invalidCsv(rows: { line: number; column?: string; message: string }[]): AppError {
  const n = rows.length;
  return new AppError(
    400,
    'invalid_csv',
    `The file has ${n} problem${n === 1 ? '' : 's'}; nothing was imported.`,
    undefined,
    rows.slice(0, 200),
  );
}
export const serviceDown = (message: string) => new AppError(503, 'service_unavailable', message);

export function zodFields(error: ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.join('.') : '_';
    fields[key] ??= issue.message;
  }
  return fields;
}

/**
 * Parses request input with a zod schema; a failure is a 400 naming each bad field. No input at
 * all (a request without a JSON body: none, or another content type) is a 400 of its own, before
 * the schema, whose refinements may read fields of what they are given.
 */
export function parse<S extends z.ZodType>(schema: S, value: unknown, what = 'input'): z.infer<S> {
  if (value === undefined) {
    throw badRequest(`The ${what} is missing: send it as a JSON body (Content-Type: application/json).`, {
      _: 'Send a JSON body.',
    });
  }
  const result = schema.safeParse(value);
  if (!result.success) {
    const fields = zodFields(result.error);
    const first = Object.entries(fields)[0];
    const detail = first ? ` (${first[0] === '_' ? '' : `${first[0]}: `}${first[1]})` : '';
    throw badRequest(`The ${what} is not valid${detail}.`, fields);
  }
  return result.data;
}

export const notFoundApi: RequestHandler = (req, _res, next) => {
  next(new AppError(404, 'not_found', `No API route ${req.method} ${req.path}.`));
};

/** Marks an error thrown while reading a multipart body (multer passes busboy's errors on bare). */
export const MULTIPART = Symbol('multipart');
export function multipartError(error: unknown): unknown {
  if (error && typeof error === 'object') (error as { [MULTIPART]?: boolean })[MULTIPART] = true;
  return error;
}

const BODY_ERRORS: Record<string, (error: { message?: string; encoding?: string }) => AppError> = {
  'entity.parse.failed': () => new AppError(400, 'invalid_json', 'The request body is not valid JSON.'),
  'entity.too.large': () => new AppError(413, 'too_large', 'The request body is too large.'),
  'charset.unsupported': () =>
    new AppError(415, 'unsupported_charset', 'Send the request body as UTF-8 JSON.'),
  'encoding.unsupported': (e) =>
    new AppError(
      415,
      'unsupported_encoding',
      `The Content-Encoding${e.encoding ? ` "${e.encoding.slice(0, 40)}"` : ''} is not supported; send the body uncompressed, or as gzip, deflate or br.`,
    ),
};

/**
 * What went wrong reading the request itself, as the client's error: the JSON body parser's
 * errors (each a 4xx it marks `expose`; a compressed body that does not inflate is one, a 400),
 * multer's and busboy's for a multipart upload, and a path that does not decode. Null for any
 * other error.
 */
function readError(error: unknown): AppError | null {
  const e = error as {
    name?: string;
    code?: string;
    type?: string;
    status?: number;
    expose?: boolean;
    message?: string;
    encoding?: string;
    [MULTIPART]?: boolean;
  } | null;
  if (!e || typeof e !== 'object') return null;
  const known = e.type !== undefined ? BODY_ERRORS[e.type] : undefined;
  if (known) return known(e);
  if (e.name === 'MulterError' && e.code === 'LIMIT_FILE_SIZE') {
    return new AppError(413, 'too_large', 'The file is too large.');
  }
  if (e.name === 'MulterError' || e[MULTIPART]) {
    return new AppError(
      400,
      'invalid_multipart',
      `The upload is not a well-formed multipart/form-data request (${String(e.message).slice(0, 120)}).`,
    );
  }
  const status = e.status ?? 0;
  if (status >= 400 && status < 500 && (e.expose === true || error instanceof URIError)) {
    return status === 415
      ? new AppError(415, 'unsupported_media_type', 'The request body is in a form this route does not read.')
      : new AppError(
          400,
          'unreadable_request',
          error instanceof URIError
            ? 'The address holds a malformed percent-encoded character.'
            : 'The request body could not be read: it was cut short, or its compression is corrupt.',
        );
  }
  return null;
}

function isDatabaseDown(error: unknown): boolean {
  const code = (error as { code?: string })?.code;
  return code === 'ECONNREFUSED' || code === '57P01' || code === '57P03' || code === 'ETIMEDOUT';
}

export function errorHandler(logger: Logger): ErrorRequestHandler {
  return (error, req, res, _next) => {
    let appError: AppError;
    const unreadable = readError(error);
    if (error instanceof AppError) {
      appError = error;
    } else if (error instanceof ZodError) {
      appError = badRequest('The input is not valid.', zodFields(error));
    } else if (unreadable) {
      appError = unreadable;
    } else if (isDatabaseDown(error)) {
      appError = serviceDown('The database is not reachable; try again shortly.');
    } else {
      // Without pino-http's per-request child logger (see requestLogging), the line names the request.
      const request = req.id === undefined ? { req: { method: req.method, url: req.originalUrl } } : {};
      (req.log ?? logger).error({ err: error, ...request }, 'unhandled error');
      appError = new AppError(500, 'internal', 'Something went wrong on our side.');
    }
    if (res.headersSent) return res.end();
    res.status(appError.status).json({
      error: {
        code: appError.code,
        message: appError.message,
        ...(appError.fields ? { fields: appError.fields } : {}),
        ...(appError.rows ? { rows: appError.rows } : {}),
      },
    });
  };
}
