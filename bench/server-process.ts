import type { ChildProcess } from "node:child_process";

/** Waits until a server started for a bench answers at `url` (anything below 500), polling every 100 ms. */
export async function waitFor(url: string, tries = 900) {
  for (let i = 0; i < tries; i++) {
    try {
      if ((await fetch(url)).status < 500) return;
    } catch {}
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`${url} did not come up`);
}

/** Stops a bench's server and waits for it to exit. */
export async function stop(child: ChildProcess) {
  if (child.exitCode !== null) return;
  const exited = new Promise((r) => child.once("exit", r));
  child.kill("SIGTERM");
  await exited;
}
