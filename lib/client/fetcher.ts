/** The API's error, with its code, status and field messages, so screens can say what went wrong. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields: Record<string, string> = {},
  ) {
    super(message);
    this.name = "ApiError";
  }
}

async function toApiError(res: Response): Promise<ApiError> {
  try {
    const body = (await res.json()) as { error?: { code?: string; message?: string; fields?: Record<string, string> } };
    return new ApiError(res.status, body.error?.code ?? "unknown", body.error?.message ?? res.statusText, body.error?.fields);
  } catch {
    return new ApiError(res.status, "unknown", `The server answered ${res.status} ${res.statusText}.`);
  }
}

/** SWR's fetcher: JSON on success, ApiError otherwise. */
export async function fetchJson<T>(url: string): Promise<T> {
  const res = await fetch(url, { headers: { Accept: "application/json" } });
  if (!res.ok) throw await toApiError(res);
  return (await res.json()) as T;
}

/** A write through the REST API; resolves to the JSON body (or undefined for 204). */
export async function sendJson<T>(url: string, method: "POST" | "PATCH" | "PUT" | "DELETE", body?: unknown): Promise<T> {
  const res = await fetch(url, {
    method,
    headers: { "Content-Type": "application/json", Accept: "application/json" },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  if (!res.ok) throw await toApiError(res);
  return (res.status === 204 ? undefined : await res.json()) as T;
}
