/** What the browser gets back from our JSON API. */
export type ApiResult<T> =
  | { ok: true; status: number; body: T }
  | { ok: false; status: number; error: { code: string; message: string; fields?: Record<string, string[]> } };

/**
 * Posts JSON to the API with an Idempotency-Key, so a retried tap or a resend after a
 * dropped connection records the event once.
 */
export async function postJson<T>(url: string, body: unknown, idempotencyKey: string = crypto.randomUUID()): Promise<ApiResult<T>> {
  let response: Response;
  try {
    response = await fetch(url, {
      method: "POST",
      headers: { "content-type": "application/json", "idempotency-key": idempotencyKey },
      body: JSON.stringify(body),
    });
  } catch {
    return { ok: false, status: 0, error: { code: "network", message: "" } };
  }
  const json = await response.json().catch(() => ({}));
  if (response.ok) return { ok: true, status: response.status, body: json as T };
  return { ok: false, status: response.status, error: json.error ?? { code: "internal", message: "" } };
}
