// The browser's way to call the JSON API (client-safe). Every error answer is thrown as ApiError
// with the server's code, message and per-field messages, so a form can name the field that failed.
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    /** Messages per field by dotted path, e.g. "lines.3.counted" (422 answers). */
    readonly fields: Record<string, string[]> = {},
    /** The error's whole details object (e.g. available and unit on INSUFFICIENT_STOCK). */
    readonly details: Record<string, unknown> = {},
  ) {
    super(message);
    this.name = "ApiError";
  }
}

export async function apiFetch<T>(url: string, init?: RequestInit): Promise<T> {
  let res: Response;
  try {
    res = await fetch(url, { credentials: "same-origin", ...init, headers: { accept: "application/json", ...init?.headers } });
  } catch {
    throw new ApiError(0, "NETWORK", "The server could not be reached. Check the connection and try again.");
  }
  const body: unknown = await res.json().catch(() => null);
  if (!res.ok) {
    const e = (body as { error?: { code?: string; message?: string; details?: { fields?: Record<string, string[]> } & Record<string, unknown> } } | null)?.error;
    throw new ApiError(res.status, e?.code ?? "HTTP_ERROR", e?.message ?? `The server answered ${res.status}.`, e?.details?.fields ?? {}, e?.details ?? {});
  }
  return body as T;
}

export const jsonInit = (method: string, body: unknown, headers: Record<string, string> = {}): RequestInit => ({
  method,
  headers: { "content-type": "application/json", ...headers },
  body: JSON.stringify(body),
});
