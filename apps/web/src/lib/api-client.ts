import type { ApiError as ApiErrorBody, FieldErrors } from '@emberline/contracts/errors';

/** An error answered by the API, in the contract's error shape. */
export class ApiError extends Error {
  override name = 'ApiError';
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly requestId?: string,
    readonly details?: unknown,
  ) {
    super(message);
  }

  /** Field-level messages, when the server gave them. */
  get fieldErrors(): FieldErrors | null {
    const details = this.details as Partial<FieldErrors> | undefined;
    return details && typeof details === 'object' && details.fields
      ? { fields: details.fields, form: details.form ?? [] }
      : null;
  }
}

const BASE = '/api/v1';

/** The address of an API path, for what `fetch` does not send (an upload's XMLHttpRequest, an <img>). */
export const apiUrl = (path: string) => `${BASE}${path}`;

type Method = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';

async function request<T>(
  method: Method,
  path: string,
  body?: unknown,
  raw?: { content: Blob; type: string },
): Promise<T> {
  let response: Response;
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (raw) headers['Content-Type'] = raw.type;
  else if (body !== undefined) headers['Content-Type'] = 'application/json';
  try {
    response = await fetch(apiUrl(path), {
      method,
      credentials: 'same-origin',
      headers,
      body: raw ? raw.content : body === undefined ? undefined : JSON.stringify(body),
    });
  } catch {
    throw new ApiError(
      0,
      'network',
      'Emberline cannot reach its server. Check the connection and try again.',
    );
  }
  if (response.status === 204) return undefined as T;
  const text = await response.text();
  let json: unknown;
  try {
    json = text ? JSON.parse(text) : null;
  } catch {
    json = null;
  }
  if (!response.ok) {
    const error = (json as ApiErrorBody | null)?.error;
    throw new ApiError(
      response.status,
      error?.code ?? 'http_error',
      error?.message ?? `The server answered ${response.status}`,
      error?.requestId,
      error?.details,
    );
  }
  return json as T;
}

export const api = {
  get: <T>(path: string) => request<T>('GET', path),
  post: <T>(path: string, body?: unknown) => request<T>('POST', path, body ?? {}),
  patch: <T>(path: string, body: unknown) => request<T>('PATCH', path, body),
  put: <T>(path: string, body: unknown) => request<T>('PUT', path, body),
  /** Sends a file's bytes as the body, so that the server sees them as they are. */
  upload: <T>(path: string, content: Blob, type: string) =>
    request<T>('POST', path, undefined, { content, type }),
  delete: <T>(path: string) => request<T>('DELETE', path),
};
