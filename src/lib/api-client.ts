import { z } from 'zod';

/** The error body every Hilum API error leaves with (see API.md, "Conventions"). */
const errorBodySchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    fields: z.record(z.string(), z.string()).optional(),
  }),
});

export type ApiErrorFields = Record<string, string>;

export class ApiError extends Error {
  override readonly name = 'ApiError';
  /** HTTP status; 0 when the server could not be reached at all. */
  readonly status: number;
  readonly code: string;
  /** Per-field messages of a 400, keyed by the input path (for react-hook-form's setError). */
  readonly fields: ApiErrorFields | undefined;
  /** The parsed JSON body, when there was one (a 503 from /api/health still carries its parts). */
  readonly body: unknown;

  constructor(init: {
    status: number;
    code: string;
    message: string;
    fields?: ApiErrorFields | undefined;
    body?: unknown;
  }) {
    super(init.message);
    this.status = init.status;
    this.code = init.code;
    this.fields = init.fields;
    this.body = init.body;
  }
}

export function isApiError(error: unknown): error is ApiError {
  return error instanceof ApiError;
}

type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

export interface ApiFetchOptions {
  method?: Method;
  /** Sent as JSON, or as-is when it is FormData (photo and CSV uploads). */
  body?: unknown;
  headers?: HeadersInit;
  signal?: AbortSignal;
}

export async function apiFetch<S extends z.ZodType>(
  path: string,
  options: ApiFetchOptions & { schema: S },
): Promise<z.output<S>>;
export async function apiFetch(
  path: string,
  options?: ApiFetchOptions & { schema?: undefined },
): Promise<unknown>;
export async function apiFetch(
  path: string,
  { method = 'GET', body, headers, signal, schema }: ApiFetchOptions & { schema?: z.ZodType } = {},
): Promise<unknown> {
  const requestHeaders = new Headers(headers);
  requestHeaders.set('Accept', 'application/json');
  let requestBody: BodyInit | undefined;
  if (body instanceof FormData) {
    requestBody = body; // the browser sets the multipart boundary itself
  } else if (body !== undefined) {
    requestHeaders.set('Content-Type', 'application/json');
    requestBody = JSON.stringify(body);
  }

  let response: Response;
  try {
    response = await fetch(path, {
      method,
      headers: requestHeaders,
      body: requestBody,
      credentials: 'same-origin',
      signal,
    });
  } catch (cause) {
    if (signal?.aborted) throw cause; // let TanStack Query see its own cancellation
    throw new ApiError({
      status: 0,
      code: 'network_error',
      message: 'The Hilum server could not be reached. Check the connection and try again.',
    });
  }

  const data = await readJson(response);

  if (!response.ok) {
    const parsed = errorBodySchema.safeParse(data);
    if (parsed.success) {
      throw new ApiError({ status: response.status, ...parsed.data.error, body: data });
    }
    if (response.status === 502 || response.status === 503 || response.status === 504) {
      // A proxy or gateway answering for a server that is down or restarting.
      throw new ApiError({
        status: response.status,
        code: 'server_unavailable',
        message: 'The Hilum server is not answering right now. Try again in a moment.',
        body: data,
      });
    }
    throw new ApiError({
      status: response.status,
      code: 'http_error',
      message: `The server answered ${response.status}${response.statusText ? ` ${response.statusText}` : ''}.`,
      body: data,
    });
  }

  if (!schema) return data;
  const result = schema.safeParse(data);
  if (!result.success) {
    throw new ApiError({
      status: response.status,
      code: 'unexpected_response',
      message: `The server's answer to ${path} was not in the expected shape.`,
      body: data,
    });
  }
  return result.data;
}

/** The body as JSON, or undefined when it is empty or not JSON (a 204, a proxy's HTML error page). */
async function readJson(response: Response): Promise<unknown> {
  if (response.status === 204 || response.status === 205) return undefined;
  const type = response.headers.get('Content-Type') ?? '';
  if (!type.includes('json')) return undefined;
  const text = await response.text();
  if (text.trim() === '') return undefined;
  try {
    return JSON.parse(text) as unknown;
  } catch {
    return undefined;
  }
}
