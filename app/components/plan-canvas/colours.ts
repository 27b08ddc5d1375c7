// The drawing's colours: Konva paints with plain values, so these mirror the page's palette.
export const COLOURS = {
  outline: "#2f5d7c",
  fill: "#dbe8f1",
  grid: "#e6e1d6",
  gridMajor: "#d2cbbb",
  ink: "#17212b",
  point: "#9a6a14",
  pass: "#2e7346",
  warn: "#9a5b00",
  fail: "#a8261d",
  none: "#3d4a57",
  /** The selection ring: the brass of the page's focus outline. */
  focus: "#9a6a14",
};
