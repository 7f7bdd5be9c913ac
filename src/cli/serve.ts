/**
 * The production server `npm start` runs: Next.js for every page, action and route, behind a
 * front door that refuses malformed paths and oversized bodies before anything reads them
 * (src/server/platform/front-door.ts). Run with `--conditions=react-server` (tsx), after `next build`.
 */
import http from "node:http";

const env = process.env as Record<string, string | undefined>;
env.NODE_ENV = "production";
env.NEXT_TELEMETRY_DISABLED ??= "1";
const port = Number(env.PORT || 3000);
// Every interface unless GRAINLINE_HOST names one (HOSTNAME is not used: containers set it to their own name).
const hostname = env.GRAINLINE_HOST || undefined;

// Next first: it installs the request-scoped storage the app's modules capture when loaded.
const { default: next } = await import("next");
const app = next({ dev: false, dir: process.cwd(), port, hostname: "localhost" });
await app.prepare();
const nextHandler = app.getRequestHandler();
const { frontDoor } = await import("../server/platform/front-door");
// HSTS only when the public origin is https (src/server/platform/public-origin.ts). Set here, at run time,
// because next.config.ts headers are fixed at build time; the front door's refusals keep it too.
const transportSecurity = (await import("../server/platform/public-origin")).transportSecurityHeaders();
// WAL checkpoints in a worker thread, so no request waits for one (src/server/platform/checkpointer.ts);
// GRAINLINE_CHECKPOINTS=inline leaves them to SQLite's default, at commit.
const { getSqlite } = await import("../server/platform/db");
const checkpointer = env.GRAINLINE_CHECKPOINTS === "inline" ? null : (await import("../server/platform/checkpointer")).startCheckpointer(getSqlite());

// Malformed paths (400) and bodies over their limit (413) are answered before anything reads
// the body; everything else goes to Next (src/server/platform/front-door.ts).
const door = frontDoor((req, res) => {
  nextHandler(req, res).catch((error: unknown) => {
    // Next answers its own errors; this is one it could not, so the request still gets an answer.
    console.error(error);
    if (!res.headersSent) res.writeHead(500, { "content-type": "text/plain; charset=utf-8" });
    res.end("Something went wrong on our side.");
  });
});
const withTransportSecurity = (handle: http.RequestListener) => (req: http.IncomingMessage, res: http.ServerResponse) => {
  for (const [name, value] of transportSecurity) res.setHeader(name, value);
  handle(req, res);
};
const server = http.createServer(withTransportSecurity(door.request));
server.on("checkContinue", withTransportSecurity(door.checkContinue));
server.listen(port, hostname, () => console.log(`Grainline is listening on http://${hostname ?? "localhost"}:${port}`));

async function stop() {
  server.close();
  await checkpointer?.stop();
  await app.close();
  process.exit(0);
}
process.on("SIGTERM", () => void stop());
process.on("SIGINT", () => void stop());
