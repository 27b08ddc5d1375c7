// Work a response must not wait for, such as mail whose sending time would tell an observer whether an account
// exists. It starts after the current I/O turn, its failures are logged (never thrown into a request), and
// tests can wait for all of it to finish.

const pending = new Set<Promise<void>>();

/** Runs `task` after the response is on its way; `what` names it in the log if it fails. */
export function runInBackground(what: string, task: () => Promise<unknown>) {
  const run = new Promise<void>((resolve) => {
    setImmediate(() => {
      task()
        .catch((error: unknown) => console.error(`Plumbline: ${what} failed:`, error))
        .finally(() => resolve());
    });
  });
  pending.add(run);
  void run.then(() => pending.delete(run));
}

/** Resolves when every background task started so far (and any they started) has finished. */
export async function settleBackgroundWork() {
  while (pending.size > 0) await Promise.all([...pending]);
}
