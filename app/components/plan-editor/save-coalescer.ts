// When the editor saves: once the planner has paused (no change for `idleMs`), or at once when asked (leaving
// the page, the window losing focus, Ctrl+S). Changes while a save is on its way wait for its answer and go in
// one save after it, so two saves never race with the same version. No React, no fetch: the caller's `send`
// does the saving and resolves when the server has answered.

export type SaveCoalescer = {
  /** The document changed: save once no further change comes for idleMs. */
  changed(): void;
  /** Save a waiting change now (nothing happens when none waits). */
  flush(): void;
  /** Forget a waiting change and its timer (the editor closes or saving stops). */
  cancel(): void;
  /** Whether a change waits to be saved. */
  readonly pending: boolean;
};

export function createSaveCoalescer(send: () => Promise<unknown>, idleMs = 800): SaveCoalescer {
  let timer: ReturnType<typeof setTimeout> | null = null;
  let dirty = false;
  let inFlight = false;
  let flushAfter = false;

  const clear = () => {
    if (timer !== null) clearTimeout(timer);
    timer = null;
  };
  const run = async () => {
    clear();
    if (!dirty) return;
    if (inFlight) {
      flushAfter = true;
      return;
    }
    dirty = false;
    inFlight = true;
    try {
      await send();
    } finally {
      inFlight = false;
      if (dirty && flushAfter) {
        flushAfter = false;
        void run();
      } else if (dirty && timer === null) {
        timer = setTimeout(() => void run(), idleMs);
      }
    }
  };
  return {
    changed() {
      dirty = true;
      clear();
      timer = setTimeout(() => void run(), idleMs);
    },
    flush() {
      void run();
    },
    cancel() {
      clear();
      dirty = false;
      flushAfter = false;
    },
    get pending() {
      return dirty;
    },
  };
}
