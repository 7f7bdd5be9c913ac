import { describe, expect, it, vi } from "vitest";
import { inTurn, REQUESTS_PER_TURN } from "./turns";

// Node runs the immediates queued during a turn's check phase in the next turn
// (https://nodejs.org/en/learn/asynchronous-work/event-loop-timers-and-nexttick).
const nextTurn = () => new Promise<void>((resolve) => setImmediate(resolve));

describe("inTurn", () => {
  it("runs waiting work in arrival order, a few per turn of the event loop", async () => {
    const order: string[] = [];
    for (let i = 0; i < 10; i++) inTurn(() => order.push(`r${i}`));
    // Queued after the first batch's immediate: runs once that batch is done.
    setImmediate(() => order.push("turn"));
    await nextTurn();
    await nextTurn();
    await nextTurn();
    expect(REQUESTS_PER_TURN).toBe(4);
    expect(order).toEqual(["r0", "r1", "r2", "r3", "turn", "r4", "r5", "r6", "r7", "r8", "r9"]);
  });

  it("goes on after a run that throws", async () => {
    const error = vi.spyOn(console, "error").mockImplementation(() => {});
    const done: number[] = [];
    inTurn(() => {
      throw new Error("a run that failed");
    });
    inTurn(() => done.push(1));
    await nextTurn();
    expect(done).toEqual([1]);
    expect(error).toHaveBeenCalledOnce();
    error.mockRestore();
  });
});
