// A production server of a test's own (as `npm start` runs it), on a
// database of its own: for tests that stop, kill or restart it.
import { spawn, type ChildProcess } from "node:child_process";
import path from "node:path";
import { SERVE_ARGS } from "../../src/cli/serve-command";

const root = path.resolve(import.meta.dirname, "../..");

export function productionServer(port: number, db: string) {
  const base = `http://localhost:${port}`;
  const env = { ...process.env, GRAINLINE_DB: db, PORT: String(port), NEXT_TELEMETRY_DISABLED: "1" };

  /** Starts the server and resolves once its sign-in page answers. */
  async function start(): Promise<ChildProcess> {
    const child = spawn(process.execPath, SERVE_ARGS, { cwd: root, env, stdio: "ignore" });
    for (let i = 0; i < 300; i++) {
      try {
        if ((await fetch(`${base}/sign-in`)).ok) return child;
      } catch {}
      await new Promise((r) => setTimeout(r, 100));
    }
    child.kill("SIGKILL");
    throw new Error("server did not start");
  }

  /** Stops it the way a service manager would, and waits for it to exit. */
  async function stop(child: ChildProcess): Promise<void> {
    if (child.exitCode !== null || child.signalCode !== null) return;
    const exited = new Promise((r) => child.once("exit", r));
    child.kill("SIGTERM");
    await exited;
  }

  return { base, env, root, start, stop };
}
