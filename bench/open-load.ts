/**
 * The open-model load of `npm run bench:load` (bench/LOAD.md, "The floor at a fixed arrival
 * rate"): requests leave on a fixed schedule, whether or not earlier ones have been answered,
 * and each one's latency runs from the time it was due to be sent. A server that falls behind
 * therefore shows its queue in the figures, as wrk2 does ("corrected for coordinated omission").
 *
 * Like wrk2, request i is due at start + i / rate and goes on connection i mod N: each of the N
 * keep-alive connections is one phone, sending every N / rate seconds, and a request due while
 * its phone still waits for a reply waits behind it. autocannon's `overallRate` was not used:
 * it sends each connection's quota at the start of every second and then waits, and it corrects
 * latencies with an interval of 1 ms whatever the rate (lib/run.js, lib/httpClient.js).
 */
import http from "node:http";
import { performance } from "node:perf_hooks";

export type FloorMix = {
  /** The share of requests that are writes (the rest are reads), between 0 and 1. */
  writeShare: number;
  read: { path: string; status: number };
  write: { path: string; body: string; status: number };
  headers: Record<string, string>;
};

export type OpenRun = {
  rate: number;
  seconds: number;
  sent: number;
  writes: number;
  /** Requests with another status than expected, or a connection error. */
  failed: number;
  /** Requests still unanswered when the run gave up waiting (their latency is counted up to then). */
  unanswered: number;
  p50: number;
  p99: number;
  max: number;
  /** The latest a request left after it was due: the driver's own lag, already inside the latencies. */
  sendLag: number;
};

/** Latencies in ms, nearest rank. */
export function percentile(sorted: readonly number[], q: number): number {
  if (!sorted.length) return Number.NaN;
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil(q * sorted.length) - 1))]!;
}

/** A small seeded generator (mulberry32), so every run draws the same sequence of reads and writes. */
function seeded(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = Math.imul(a ^ (a >>> 15), 1 | a);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/**
 * N phones on one server. The connections stay open across runs (a warm-up first opens them all),
 * so measured runs see phones already connected, as on the floor.
 */
export function openFloor(base: string, connections: number, mix: FloorMix) {
  const url = new URL(base);
  // One agent of one socket per phone: a request due while the phone waits queues on it.
  const phones = Array.from({ length: connections }, () => new http.Agent({ keepAlive: true, maxSockets: 1 }));
  const writeHeaders = { ...mix.headers, "content-type": "application/json", "content-length": String(Buffer.byteLength(mix.write.body)) };

  function send(phone: http.Agent, write: boolean, done: (ok: boolean) => void) {
    const request = http.request(
      { agent: phone, host: url.hostname, port: url.port, method: write ? "POST" : "GET", path: write ? mix.write.path : mix.read.path, headers: write ? writeHeaders : mix.headers },
      (response) => {
        response.resume();
        response.on("end", () => done(response.statusCode === (write ? mix.write.status : mix.read.status)));
        response.on("error", () => done(false));
      },
    );
    request.on("error", () => done(false));
    request.end(write ? mix.write.body : undefined);
  }

  /** Sends `rate` requests a second for `seconds`, then waits for the replies (at most `drainSeconds`). */
  function run(rate: number, seconds: number, { seed = 1, drainSeconds = 30 } = {}): Promise<OpenRun> {
    const total = Math.round(rate * seconds);
    const interval = 1000 / rate;
    const draw = seeded(seed);
    const latencies: number[] = [];
    let writes = 0;
    let failed = 0;
    let answered = 0;
    let sendLag = 0;
    let next = 0;
    let finished = false;
    const waiting = new Set<number>(); // due times of the requests not yet answered
    const start = performance.now() + 20;
    return new Promise((resolve) => {
      let giveUp: NodeJS.Timeout | undefined;
      const finish = () => {
        if (finished) return;
        finished = true;
        clearTimeout(giveUp);
        const now = performance.now();
        const unanswered = waiting.size;
        // Whatever is still out counts with the time it has waited so far: the p99 is then a lower bound.
        for (const due of waiting) latencies.push(now - due);
        latencies.sort((x, y) => x - y);
        resolve({ rate, seconds, sent: next, writes, failed: failed + unanswered, unanswered, p50: percentile(latencies, 0.5), p99: percentile(latencies, 0.99), max: latencies.at(-1) ?? Number.NaN, sendLag });
      };
      const tick = () => {
        const now = performance.now();
        while (next < total && start + next * interval <= now) {
          const due = start + next * interval;
          sendLag = Math.max(sendLag, now - due);
          const write = draw() < mix.writeShare;
          if (write) writes++;
          waiting.add(due);
          send(phones[next % connections]!, write, (ok) => {
            if (finished) return;
            waiting.delete(due);
            latencies.push(performance.now() - due);
            if (!ok) failed++;
            if (++answered === total) finish();
          });
          next++;
        }
        if (next < total) setTimeout(tick, Math.max(0, start + next * interval - performance.now()));
        else giveUp = setTimeout(finish, drainSeconds * 1000);
      };
      setTimeout(tick, 20);
    });
  }

  function close() {
    for (const phone of phones) phone.destroy();
  }

  return { run, close };
}
