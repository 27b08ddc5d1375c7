// Placing the drawing's labels where they cross the fewest lines, markers and other labels.
import { segmentHitsBox as hitsBox } from "~/plans/drawing-layout";
import type { Style } from "~/plans/pdf/layout.server";

export type Box = { x: number; y: number; w: number; h: number };

/** Whether any part of the segment lies inside the box (the same test the editor's drawings use). */
export function segmentHitsBox(s: { x1: number; y1: number; x2: number; y2: number }, r: Box): boolean {
  return hitsBox({ x: s.x1, y: s.y1 }, { x: s.x2, y: s.y2 }, { x: r.x, y: r.y, width: r.w, height: r.h });
}

export const boxesOverlap = (a: Box, b: Box) =>
  a.x < b.x + b.w && b.x < a.x + a.w && a.y < b.y + b.h && b.y < a.y + a.h;

export type Point = { x: number; y: number };
export type Candidate = Point & { anchor: Point };
export type LabelLines = Array<{ text: string; style: Style }>;

/** Places labels one by one where they cross the fewest lines, markers and earlier labels, inside the frame. */
export class LabelPlacer {
  private placed: Box[] = [];
  constructor(
    private readonly frame: Box,
    private readonly segments: Array<{ x1: number; y1: number; x2: number; y2: number }>,
    private readonly markers: Box[],
    private readonly outline: Box | null,
  ) {}

  place(size: { w: number; h: number }, candidates: Candidate[]): { box: Box; anchor: Point } {
    let best: { box: Box; anchor: Point } | null = null;
    let bestScore = Infinity;
    const inner = { x: this.frame.x + 2, y: this.frame.y + 2, w: this.frame.w - 4, h: this.frame.h - 4 };
    for (const c of candidates) {
      const box = { x: c.x, y: c.y, w: size.w, h: size.h };
      // Prefer spots near what the label names; then avoid the frame edge, lines, markers and other labels.
      let score = Math.hypot(box.x + box.w / 2 - c.anchor.x, box.y + box.h / 2 - c.anchor.y) * 0.02;
      if (box.x < inner.x || box.y < inner.y || box.x + box.w > inner.x + inner.w || box.y + box.h > inner.y + inner.h)
        score += 1000;
      for (const s of this.segments) if (segmentHitsBox(s, box)) score += 50;
      for (const m of this.markers) if (boxesOverlap(m, box)) score += 80;
      for (const p of this.placed) if (boxesOverlap(p, box)) score += 200;
      // A leader from this spot must not run through a label already placed.
      const nx = Math.min(Math.max(c.anchor.x, box.x), box.x + box.w);
      const ny = Math.min(Math.max(c.anchor.y, box.y), box.y + box.h);
      if (Math.hypot(c.anchor.x - nx, c.anchor.y - ny) > 7) {
        const leader = { x1: nx, y1: ny, x2: c.anchor.x, y2: c.anchor.y };
        for (const p of this.placed) if (segmentHitsBox(leader, p)) score += 30;
        for (const m of this.markers) if (segmentHitsBox(leader, m)) score += 10;
      }
      if (this.outline && boxesOverlap(this.outline, box)) score += 3;
      if (score < bestScore) {
        bestScore = score;
        best = { box, anchor: c.anchor };
      }
    }
    const chosen = best ?? {
      box: { x: inner.x, y: inner.y, w: size.w, h: size.h },
      anchor: { x: inner.x, y: inner.y },
    };
    // Keep it on the frame even when every spot is poor.
    chosen.box.x = Math.min(Math.max(chosen.box.x, inner.x), inner.x + inner.w - chosen.box.w);
    chosen.box.y = Math.min(Math.max(chosen.box.y, inner.y), inner.y + inner.h - chosen.box.h);
    this.placed.push({
      ...chosen.box,
      x: chosen.box.x - 1,
      y: chosen.box.y - 1,
      w: chosen.box.w + 2,
      h: chosen.box.h + 2,
    });
    return chosen;
  }
}
