/** The JSON error every route answers with (see lib/api/handler.ts). */
export interface ApiErrorBody {
  error: string;
  requestId?: string;
  issues?: Array<{ path: string; message: string }>;
  [key: string]: unknown;
}

export class ApiClientError extends Error {
  constructor(
    readonly status: number,
    readonly body: ApiErrorBody,
  ) {
    super(body.error || `request failed with ${status}`);
    this.name = "ApiClientError";
  }
}

/** What to show a person when a request failed: the route's own message, else the error as text. */
export function errorText(error: unknown): string {
  return error instanceof ApiClientError ? error.body.error : String(error);
}

/** fetch for the browser side: JSON in and out, typed errors for TanStack Query's onError. */
export async function apiFetch<T>(path: string, init: RequestInit & { json?: unknown } = {}): Promise<T> {
  const { json, headers, ...rest } = init;
  const res = await fetch(path, {
    ...rest,
    headers: { ...(json !== undefined ? { "content-type": "application/json" } : {}), ...headers },
    body: json !== undefined ? JSON.stringify(json) : rest.body,
  });
  const text = await res.text();
  const body: unknown = text ? JSON.parse(text) : null;
  if (!res.ok) throw new ApiClientError(res.status, (body as ApiErrorBody) ?? { error: res.statusText });
  return body as T;
}
