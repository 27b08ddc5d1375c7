import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { createSaveCoalescer } from "./save-coalescer";

beforeEach(() => {
  vi.useFakeTimers();
});
afterEach(() => {
  vi.useRealTimers();
});

/** A send that answers after `answerMs` and counts its calls. */
function fakeSend(answerMs = 0) {
  const calls: number[] = [];
  const send = vi.fn(async () => {
    calls.push(Date.now());
    await new Promise((r) => setTimeout(r, answerMs));
  });
  return { send, calls };
}

describe("autosave coalescing", () => {
  it("a run of moves 50 ms apart is one save, 800 ms after the last", async () => {
    const { send, calls } = fakeSend();
    const c = createSaveCoalescer(send, 800);
    const start = Date.now();
    for (let i = 0; i < 30; i++) {
      c.changed();
      await vi.advanceTimersByTimeAsync(50);
    }
    expect(send).not.toHaveBeenCalled();
    await vi.advanceTimersByTimeAsync(749);
    expect(send).not.toHaveBeenCalled();
    await vi.advanceTimersByTimeAsync(1);
    expect(send).toHaveBeenCalledTimes(1);
    expect(calls[0]! - start).toBe(30 * 50 + 750);
    await vi.advanceTimersByTimeAsync(5000);
    expect(send).toHaveBeenCalledTimes(1);
    expect(c.pending).toBe(false);
  });

  it("one move is one save after the pause", async () => {
    const { send } = fakeSend();
    const c = createSaveCoalescer(send, 800);
    c.changed();
    await vi.advanceTimersByTimeAsync(10_000);
    expect(send).toHaveBeenCalledTimes(1);
  });

  it("flush sends a waiting change at once and only once; with nothing waiting it sends nothing", async () => {
    const { send } = fakeSend();
    const c = createSaveCoalescer(send, 800);
    c.flush();
    expect(send).not.toHaveBeenCalled();
    c.changed();
    c.flush();
    expect(send).toHaveBeenCalledTimes(1);
    c.flush();
    await vi.advanceTimersByTimeAsync(2000);
    expect(send).toHaveBeenCalledTimes(1);
  });

  it("changes while a save is on its way go in one save after its answer, never two at once", async () => {
    let open = 0;
    let most = 0;
    const send = vi.fn(async () => {
      open++;
      most = Math.max(most, open);
      await new Promise((r) => setTimeout(r, 1000));
      open--;
    });
    const c = createSaveCoalescer(send, 800);
    c.changed();
    await vi.advanceTimersByTimeAsync(800);
    expect(send).toHaveBeenCalledTimes(1);
    for (let i = 0; i < 5; i++) {
      c.changed();
      await vi.advanceTimersByTimeAsync(100);
    }
    c.flush();
    await vi.advanceTimersByTimeAsync(5000);
    expect(send).toHaveBeenCalledTimes(2);
    expect(most).toBe(1);
  });

  it("cancel drops a waiting change", async () => {
    const { send } = fakeSend();
    const c = createSaveCoalescer(send, 800);
    c.changed();
    c.cancel();
    await vi.advanceTimersByTimeAsync(2000);
    expect(send).not.toHaveBeenCalled();
  });
});
