// Calls route handlers the way Next.js does: a Request in, a Response out.
type Handler = (request: Request, context?: { params?: Promise<Record<string, string>> }) => Promise<Response>;

export const ORIGIN = "http://localhost:3000";

export function jsonRequest(path: string, init: { method?: string; body?: unknown; rawBody?: string; cookie?: string; headers?: Record<string, string> } = {}) {
  // English unless a test says otherwise: the suites compare messages with the English catalogue (the app's default is Japanese).
  const headers: Record<string, string> = { host: "localhost:3000", "accept-language": "en", ...(init.headers ?? {}) };
  if (init.body !== undefined || init.rawBody !== undefined) headers["content-type"] = "application/json";
  if (init.cookie) headers.cookie = init.cookie;
  return new Request(ORIGIN + path, {
    method: init.method ?? (init.body !== undefined || init.rawBody !== undefined ? "POST" : "GET"),
    headers,
    body: init.rawBody ?? (init.body !== undefined ? JSON.stringify(init.body) : undefined),
  });
}

export async function call(handler: Handler, request: Request, params: Record<string, string> = {}) {
  const response = await handler(request, { params: Promise.resolve(params) });
  const text = await response.text();
  return { status: response.status, headers: response.headers, body: text ? JSON.parse(text) : null };
}

/** Signs in through the real route and returns the Cookie header value to send back. */
export async function signInAs(email: string, password = "grainline-demo"): Promise<string> {
  const { POST } = await import("../../app/api/auth/sign-in/route");
  const res = await call(POST, jsonRequest("/api/auth/sign-in", { body: { email, password } }));
  if (res.status !== 200) throw new Error(`sign-in as ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
  return res.headers.get("set-cookie")!.split(";")[0]!;
}

/** A digest of every row of every table but `except`: a refused request must leave them all as they were. */
export async function tableDigests(except: readonly string[] = []): Promise<Record<string, string>> {
  const { createHash } = await import("node:crypto");
  const { getSqlite } = await import("@/server/platform/db");
  const sqlite = getSqlite();
  const names = (sqlite.prepare("select name from sqlite_master where type='table' and name not like 'sqlite_%' and name not like '__drizzle%'").all() as { name: string }[]).filter(({ name }) => !except.includes(name));
  return Object.fromEntries(
    names.map(({ name }) => [name, createHash("sha256").update(JSON.stringify(sqlite.prepare(`select * from "${name}" order by rowid`).all())).digest("hex")]),
  );
}
