/**
 * The one client-side fetcher for the REST API: JSON in and out, the session
 * cookie sent along, and the API's error shape turned into an ApiError.
 */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
    readonly retryAfter?: number,
  ) {
    super(message);
  }
}

export async function api<T>(url: string, init?: RequestInit & { json?: unknown }): Promise<T> {
  const { json, ...rest } = init ?? {};
  const res = await fetch(url, {
    credentials: "same-origin",
    ...rest,
    headers: { ...(json !== undefined ? { "content-type": "application/json" } : {}), ...rest.headers },
    body: json !== undefined ? JSON.stringify(json) : rest.body,
  });
  const text = await res.text();
  let body: unknown = null;
  try {
    body = text ? JSON.parse(text) : null;
  } catch {
    body = null;
  }
  if (!res.ok) {
    const err = (body as { error?: { code?: string; message?: string; details?: unknown } } | null)?.error;
    throw new ApiError(
      res.status,
      err?.code ?? "http_" + res.status,
      err?.message ?? `The server answered ${res.status}. Try again; if it persists, reload the page.`,
      err?.details,
      Number(res.headers.get("retry-after")) || undefined,
    );
  }
  return body as T;
}

/** SWR's fetcher: GET the key. */
export const fetcher = <T,>(url: string) => api<T>(url);
