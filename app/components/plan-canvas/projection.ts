import { VIEW_AXES, type DrawingView, type Vec3 } from "~/plans/editor-state";

/** A point of the component frame in one view's two axes (a across, b up). */
export function project(p: Vec3, view: DrawingView) {
  const [a, b] = VIEW_AXES[view];
  return { a: p[a], b: p[b] };
}

/** The point `base` moved to (a, b) in one view; the axis the view does not show is kept. */
export function unproject(base: Vec3, view: DrawingView, a: number, b: number): Vec3 {
  const [ka, kb] = VIEW_AXES[view];
  return { ...base, [ka]: a, [kb]: b };
}
