// The plan editor's move-to-figures time in Chromium: the production build, a signed-in planner on the demo draft
// plan, and a lift point moved from the keyboard on the elevation drawing, timed inside the page (no round trip to
// the test process). A benchmark: it prints, it never fails a build.
//
// Each move is timed from just before the key event is dispatched to the painted frame that shows the new leg
// figures. Two figures come from that:
// - work in the frame: the key's handling up to the leg table's change, plus the frame that follows (animation-frame
//   callbacks, the drawings, style, layout and paint). This is what must fit in one 16 ms frame.
// - key to painted frame: the same with the wait for the display's next frame, which adds anything up to one frame
//   interval depending on when the key lands, so it is printed without a target.
import type { Page } from "playwright-core";
import { openBrowser, signIn } from "../e2e/browser";
import { startBuiltServer } from "../support/built-server";
import type { BenchResult } from "./statics";

const WARM_UP = 10;
const MOVES = 60;
const FRAME_TARGET_MS = 16;

type MoveTiming = { workMs: number; totalMs: number };

function percentile(values: number[], p: number) {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]!;
}

/**
 * One coarse move (shift + arrow) of the selected handle, dispatched on the focused drawing from inside the page.
 * Settles when the leg table's text has changed and the next frame has been painted; rejects if the table has not
 * changed within 2 s, so a move that does nothing can never pass for a fast one.
 */
function timeMove(page: Page, key: "ArrowLeft" | "ArrowRight"): Promise<MoveTiming> {
  return page.evaluate(
    (arrow) =>
      new Promise<MoveTiming>((resolve, reject) => {
        const body = document.querySelector("[data-testid=leg-table] tbody");
        const target = document.activeElement;
        if (!body) return reject(new Error("no leg table on the page"));
        if (!target || target.getAttribute("role") !== "application") {
          return reject(new Error("the drawing does not have keyboard focus"));
        }
        const was = body.textContent;
        const timer = setTimeout(() => {
          observer.disconnect();
          reject(new Error(`the leg table did not change within 2 s of ${arrow}`));
        }, 2000);
        let t0 = 0;
        const observer = new MutationObserver(() => {
          if (body.textContent === was) return;
          const changed = performance.now();
          observer.disconnect();
          clearTimeout(timer);
          requestAnimationFrame((frameStart) => {
            // A message posted in an animation-frame callback is handled after that frame is painted.
            const channel = new MessageChannel();
            channel.port1.onmessage = () => {
              const painted = performance.now();
              resolve({
                workMs: changed - t0 + (painted - Math.max(frameStart, changed)),
                totalMs: painted - t0,
              });
            };
            channel.port2.postMessage(null);
          });
        });
        observer.observe(body, { childList: true, subtree: true, characterData: true });
        t0 = performance.now();
        target.dispatchEvent(
          new KeyboardEvent("keydown", { key: arrow, shiftKey: true, bubbles: true, cancelable: true }),
        );
      }),
    key,
  );
}

/** Moves lift point A back and forth on the demo draft plan and reports p50 and p95 of the timings. */
export async function runEditorBench(): Promise<BenchResult[]> {
  const server = await startBuiltServer();
  try {
    const browser = await openBrowser({ width: 1440, height: 1000 }, server.baseUrl);
    try {
      const { page } = browser;
      await signIn(page, "planner@example.com");
      await page.goto("/plans/1/edit");
      await page.waitForSelector("html[data-hydrated='true']");
      await page.locator("[data-testid=view-elevation] canvas").first().waitFor();
      await page.getByTestId("leg-table").waitFor({ timeout: 10_000 });
      await page.getByRole("application", { name: /^Elevation drawing/ }).focus();
      const timings: MoveTiming[] = [];
      for (let i = 0; i < WARM_UP + MOVES; i++) {
        // Back and forth, so the point stays near where the plan has it and every move changes the figures.
        const timing = await timeMove(page, i % 2 === 0 ? "ArrowLeft" : "ArrowRight");
        if (i >= WARM_UP) timings.push(timing);
      }
      const work = timings.map((t) => t.workMs);
      const total = timings.map((t) => t.totalMs);
      const workP95 = percentile(work, 95);
      const name = (what: string) => `editor move to figures in Chromium, ${what}`;
      const info = (what: string, value: number): BenchResult => ({
        name: name(what),
        value,
        unit: "ms",
        target: Number.NaN,
        ok: true,
      });
      return [
        info("work in the frame p50", percentile(work, 50)),
        {
          name: name("work in the frame p95"),
          value: workP95,
          unit: "ms",
          target: FRAME_TARGET_MS,
          ok: workP95 <= FRAME_TARGET_MS,
        },
        info("key to painted frame p50", percentile(total, 50)),
        info("key to painted frame p95", percentile(total, 95)),
      ];
    } finally {
      await browser.close();
    }
  } finally {
    await server.stop();
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  for (const r of await runEditorBench()) console.log(`${r.name}: ${r.value.toFixed(2)} ${r.unit}`);
}
