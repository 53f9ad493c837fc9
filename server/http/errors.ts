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

// PostgreSQL's codes for a server that is going away or not yet back (class 57P: operator
// intervention; class 08: connection exception; 53300: too many connections), and the network
// errors of a connection that cannot be made or was cut.
const DATABASE_DOWN_CODES = new Set([
  '57P01',
  '57P02',
  '57P03',
  '53300',
  '08000',
  '08001',
  '08003',
  '08004',
  '08006',
]);
const NETWORK_DOWN_CODES = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'ETIMEDOUT',
  'EPIPE',
  'EHOSTUNREACH',
  'ENOTCONN',
]);
// pg's own messages for a cut connection or a pool that could not connect in time.
const DATABASE_DOWN_MESSAGE =
  /^(Connection terminated|timeout exceeded when trying to connect|Client has encountered a connection error|Client was closed)/;

type MaybeError = {
  code?: unknown;
  syscall?: unknown;
  message?: unknown;
  $metadata?: unknown;
  command?: unknown;
};

/** Whether a failure means the database cannot be reached right now (it restarts or is down). */
export function isDatabaseDown(error: unknown): boolean {
  if (!error || typeof error !== 'object') return false;
  const { code, syscall, message } = error as MaybeError;
  if (typeof code === 'string' && DATABASE_DOWN_CODES.has(code)) return true;
  if (typeof code === 'string' && NETWORK_DOWN_CODES.has(code)) return true;
  // The app reaches a local cluster over its Unix socket, whose file is gone while it is stopped.
  if (code === 'ENOENT' && syscall === 'connect') return true;
  if (typeof message === 'string' && DATABASE_DOWN_MESSAGE.test(message)) return true;
  // Several attempts at once (Node's happy eyeballs) fail as one AggregateError.
  if (error instanceof AggregateError) return error.errors.some(isDatabaseDown);
  return false;
}

/** The object store's SDK marks its errors with `$metadata`; without an HTTP status it was not reached. */
function isStorageDown(error: unknown): boolean {
  const metadata = (error as MaybeError | null)?.$metadata as { httpStatusCode?: number } | undefined;
  if (!metadata || typeof metadata !== 'object') return false;
  return metadata.httpStatusCode === undefined || metadata.httpStatusCode >= 500;
}

/** nodemailer's errors name the SMTP step (`command`) and a code for a server that did not answer. */
function isMailDown(error: unknown): boolean {
  const { code, command } = (error ?? {}) as MaybeError;
  return (
    typeof command === 'string' &&
    typeof code === 'string' &&
    ['ECONNECTION', 'ESOCKET', 'ETIMEDOUT', 'EDNS', 'ECONNREFUSED'].includes(code)
  );
}

export const databaseUnavailable = () =>
  new AppError(503, 'database_unavailable', 'The database is restarting; try again in a moment.');

/** A backing service that did not answer, as a 503 in the error shape; null for any other error. */
export function unavailableService(error: unknown): AppError | null {
  if (isStorageDown(error)) {
    return new AppError(
      503,
      'storage_unavailable',
      'Photo storage is not reachable right now; try again shortly.',
    );
  }
  if (isMailDown(error)) {
    return new AppError(
      503,
      'mail_unavailable',
      'The mail server is not reachable right now; try again shortly.',
    );
  }
  if (isDatabaseDown(error)) return databaseUnavailable();
  return null;
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
    } else {
      const unavailable = unavailableService(error);
      if (unavailable) {
        // Expected while a backing service restarts: a warning, not an error with a stack trace.
        (req.log ?? logger).warn({ err: error }, `${unavailable.code}: answered 503`);
        appError = unavailable;
      } else {
        // Without pino-http's per-request child logger (see requestLogging), the line names the request.
        const request = req.id === undefined ? { req: { method: req.method, url: req.originalUrl } } : {};
        (req.log ?? logger).error({ err: error, ...request }, 'unhandled error');
        appError = new AppError(500, 'internal', 'Something went wrong on our side.');
      }
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
