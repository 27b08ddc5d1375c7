// Where the editor's drawings put their words so nothing hides anything else: one label for lift points
// that coincide on screen (A and B one behind the other in the elevation), and the leg figures box in
// the corner that covers the fewest lines. Pure screen geometry, in pixels.

type ScreenPoint = { x: number; y: number };

/**
 * The label each lift point shows: the first of a group of points within `tolPx` of each other shows
 * every name of the group ("A/B"), the others show nothing (null).
 */
export function coincidentLabels(points: ReadonlyArray<{ label: string } & ScreenPoint>, tolPx = 12) {
  const shown = new Map<string, string | null>();
  const taken = new Set<string>();
  for (const p of points) {
    if (taken.has(p.label)) continue;
    const group = points.filter((q) => !taken.has(q.label) && Math.hypot(q.x - p.x, q.y - p.y) <= tolPx);
    for (const q of group) {
      taken.add(q.label);
      shown.set(q.label, null);
    }
    shown.set(p.label, group.map((q) => q.label).join("/"));
  }
  return shown;
}

type Box = { x: number; y: number; width: number; height: number };

/** Whether the segment a-b crosses or lies inside the box. */
export function segmentHitsBox(a: ScreenPoint, b: ScreenPoint, box: Box): boolean {
  const inside = (p: ScreenPoint) =>
    p.x >= box.x && p.x <= box.x + box.width && p.y >= box.y && p.y <= box.y + box.height;
  if (inside(a) || inside(b)) return true;
  // Liang-Barsky clipping of the segment against the box.
  let t0 = 0;
  let t1 = 1;
  const dx = b.x - a.x;
  const dy = b.y - a.y;
  const edges: Array<[number, number]> = [
    [-dx, a.x - box.x],
    [dx, box.x + box.width - a.x],
    [-dy, a.y - box.y],
    [dy, box.y + box.height - a.y],
  ];
  for (const [p, q] of edges) {
    if (Math.abs(p) < 1e-12) {
      if (q < 0) return false;
      continue;
    }
    const t = q / p;
    if (p < 0) t0 = Math.max(t0, t);
    else t1 = Math.min(t1, t);
    if (t0 > t1) return false;
  }
  return true;
}

/**
 * Where to put a box of `size` inside a drawing of `canvas`, `margin` from its edges and clear of the
 * bottom `reservedBottomPx` (the scale bar): the corner crossing the fewest `segments`, top-left first on a tie.
 */
export function placeFiguresBox(
  size: { width: number; height: number },
  canvas: { width: number; height: number },
  segments: ReadonlyArray<[ScreenPoint, ScreenPoint]>,
  margin = 8,
  reservedBottomPx = 40,
): ScreenPoint {
  const right = Math.max(margin, canvas.width - size.width - margin);
  const bottom = Math.max(margin, canvas.height - size.height - reservedBottomPx);
  const corners: ScreenPoint[] = [
    { x: margin, y: margin },
    { x: right, y: margin },
    { x: margin, y: bottom },
    { x: right, y: bottom },
  ];
  let best = corners[0]!;
  let fewest = Infinity;
  for (const corner of corners) {
    const box = { ...corner, ...size };
    const hits = segments.filter(([a, b]) => segmentHitsBox(a, b, box)).length;
    if (hits < fewest) {
      fewest = hits;
      best = corner;
    }
  }
  return best;
}
