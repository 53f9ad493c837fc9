import type { z } from 'zod';
import { ApiError } from './api-client';

export interface UploadOptions<S extends z.ZodType> {
  /** The multipart body (a photo in `photo`, a CSV file in `file`). */
  body: FormData;
  schema: S;
  /** Called as the bytes leave the browser, with the share sent so far (0 to 1). */
  onProgress?: (fraction: number) => void;
  signal?: AbortSignal;
}

const errorBody = (value: unknown) => {
  const error = (value as { error?: { code?: unknown; message?: unknown; fields?: unknown } } | null)?.error;
  if (!error || typeof error.code !== 'string' || typeof error.message !== 'string') return null;
  const fields =
    error.fields && typeof error.fields === 'object' ? (error.fields as Record<string, string>) : undefined;
  return { code: error.code, message: error.message, fields };
};

function parseJson(text: string): unknown {
  try {
    return text.trim() === '' ? undefined : (JSON.parse(text) as unknown);
  } catch {
    return undefined;
  }
}

/**
 * POSTs a multipart body with XMLHttpRequest, because fetch reports no upload progress. Errors
 * come out as the same ApiError that apiFetch throws, so callers treat both alike.
 */
export function uploadWithProgress<S extends z.ZodType>(
  path: string,
  { body, schema, onProgress, signal }: UploadOptions<S>,
): Promise<z.output<S>> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', path);
    xhr.withCredentials = true;
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.upload.addEventListener('progress', (event) => {
      if (event.lengthComputable && event.total > 0) onProgress?.(event.loaded / event.total);
    });
    xhr.addEventListener('load', () => {
      const data = parseJson(xhr.responseText);
      if (xhr.status >= 200 && xhr.status < 300) {
        onProgress?.(1);
        const parsed = schema.safeParse(data);
        if (parsed.success) return resolve(parsed.data);
        return reject(
          new ApiError({
            status: xhr.status,
            code: 'unexpected_response',
            message: `The server's answer to ${path} was not in the expected shape.`,
            body: data,
          }),
        );
      }
      const error = errorBody(data);
      if (error) return reject(new ApiError({ status: xhr.status, ...error, body: data }));
      reject(
        new ApiError({
          status: xhr.status,
          code: xhr.status >= 502 && xhr.status <= 504 ? 'server_unavailable' : 'http_error',
          message:
            xhr.status === 413
              ? 'The file is too large to upload.'
              : xhr.status >= 502 && xhr.status <= 504
                ? 'The Hilum server is not answering right now. Try again in a moment.'
                : `The server answered ${xhr.status}.`,
          body: data,
        }),
      );
    });
    xhr.addEventListener('error', () =>
      reject(
        new ApiError({
          status: 0,
          code: 'network_error',
          message: 'The upload did not reach the Hilum server. Check the connection and try again.',
        }),
      ),
    );
    xhr.addEventListener('abort', () => reject(new DOMException('The upload was cancelled.', 'AbortError')));
    signal?.addEventListener('abort', () => xhr.abort(), { once: true });
    xhr.send(body);
  });
}
