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

function median(values: number[]) {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)]!;
}

/**
 * Runs `work` while two clients ping the server without pause, and answers how much longer the slowest ping took
 * than the median of 40 pings sent alone just before (`delayMs`).
 */
export async function pingsDuring(base: string, cookie: string, work: () => Promise<unknown>): Promise<Stall> {
  const alone: number[] = [];
  for (let i = 0; i < 40; i++) alone.push(await ping(base, cookie));
  const baselineMs = median(alone);
  const during: number[] = [];
  let running = true;
  const client = async () => {
    while (running) during.push(await ping(base, cookie));
  };
  const clients = [client(), client()];
  try {
    await work();
  } finally {
    running = false;
    await Promise.all(clients);
  }
  const worstMs = Math.max(...during);
  return { pings: during.length, baselineMs, worstMs, delayMs: worstMs - baselineMs };
}
