// How long other requests wait while a long one runs: /api/ping sent again and again beside it, each on a fresh
// connection so that the server's workers take them in turn (a worker busy with the long request gets its share).
// A benchmark helper: it measures, it never fails a build.

export type Stall = { pings: number; baselineMs: number; worstMs: number; delayMs: number };

async function ping(base: string, cookie: string) {
  const start = performance.now();
  const res = await fetch(`${base}/api/ping`, { headers: { Cookie: cookie, Connection: "close" } });
  await res.arrayBuffer();
  if (!res.ok) throw new Error(`ping failed: ${res.status}`);
  return performance.now() - start;
}

/** Two clients pinging without pause while `work` runs: each ping's time. */
async function pingWhile(base: string, cookie: string, work: () => Promise<unknown>) {
  const times: number[] = [];
  let running = true;
  const client = async () => {
    while (running) times.push(await ping(base, cookie));
  };
  const clients = [client(), client()];
  try {
    await work();
  } finally {
    running = false;
    await Promise.all(clients);
  }
  return times;
}

/**
 * Runs `work` while two clients ping the server without pause, and answers how much longer the slowest ping took
 * than the slowest of the same two clients pinging for a second with nothing beside them (`delayMs`): on a shared
 * 2-core machine the clients' own pings queue on each other too, so only the excess is the work's.
 */
export async function pingsDuring(base: string, cookie: string, work: () => Promise<unknown>): Promise<Stall> {
  for (let i = 0; i < 20; i++) await ping(base, cookie);
  const alone = await pingWhile(base, cookie, () => new Promise((resolve) => setTimeout(resolve, 1000)));
  const baselineMs = Math.max(...alone);
  const during = await pingWhile(base, cookie, work);
  const worstMs = Math.max(...during);
  return { pings: during.length, baselineMs, worstMs, delayMs: Math.max(0, worstMs - baselineMs) };
}
