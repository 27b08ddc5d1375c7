// Numbered headings, label/value lists and tables that flow across pages with their headings repeated.
import type { RGB } from "pdf-lib";
import {
  BRASS,
  CONTENT_W,
  drawTag,
  INK,
  INK_SOFT,
  LEFT,
  RIGHT,
  RULE,
  STEEL,
  STEEL_WASH,
  type Flow,
  type Style,
  type Tone,
} from "~/plans/pdf/layout.server";

export function heading(flow: Flow, number: number, title: string, keepWith = 60) {
  flow.ensure(26 + keepWith);
  flow.y -= 18;
  flow.text(`${number}`, LEFT, flow.y, { font: flow.fonts.semibold, size: 11, color: BRASS });
  flow.text(title, LEFT + 16, flow.y, { font: flow.fonts.semibold, size: 11, color: STEEL });
  flow.page.drawLine({
    start: { x: LEFT, y: flow.y - 4 },
    end: { x: RIGHT, y: flow.y - 4 },
    thickness: 0.6,
    color: BRASS,
  });
  flow.y -= 10;
}

export type Fact = [label: string, value: string];

/** Label/value rows in a column; draws when `draw` is set, and returns the height either way. */
export function facts(
  flow: Flow,
  items: Fact[],
  x: number,
  width: number,
  yTop: number,
  draw: boolean,
  labelW = 74,
): number {
  const valueStyle = { font: flow.fonts.regular, size: 8.5, color: INK };
  const labelStyle = { font: flow.fonts.semibold, size: 7, color: STEEL };
  let y = yTop;
  for (const [label, value] of items) {
    const lines = flow.ts.wrap(value || "–", valueStyle.font, valueStyle.size, width - labelW);
    if (draw) {
      flow.text(label.toUpperCase(), x, y - 8.2, labelStyle);
      lines.forEach((line, i) =>
        flow.page.drawText(line, {
          x: x + labelW,
          y: y - 8.5 - i * 10.6,
          size: 8.5,
          font: valueStyle.font,
          color: INK,
        }),
      );
    }
    y -= lines.length * 10.6 + 2.6;
  }
  return yTop - y;
}

type CellItem =
  | { kind: "line"; text: string; style: Style }
  | { kind: "tag"; text: string; tone: Tone }
  | { kind: "signoff"; label: string };
export type Cell = { items: CellItem[] };
export type Column = { title: string; width: number; align?: "left" | "right" };

const CELL_PAD_X = 3.5;
const CELL_PAD_Y = 3;
const itemHeight = (item: CellItem) => (item.kind === "line" ? item.style.size * 1.3 : item.kind === "tag" ? 12 : 17);

/** A cell of wrapped text blocks (each block its own style), an optional tag first and a sign-off line last. */
export function cell(
  flow: Flow,
  width: number,
  blocks: Array<{ text: string; style: Style }>,
  extra: { tag?: { text: string; tone: Tone }; signoff?: string } = {},
): Cell {
  const items: CellItem[] = [];
  if (extra.tag) items.push({ kind: "tag", ...extra.tag });
  for (const b of blocks) {
    if (b.text === "") continue;
    for (const line of flow.ts.wrap(b.text, b.style.font, b.style.size, width - 2 * CELL_PAD_X))
      items.push({ kind: "line", text: line, style: b.style });
  }
  if (extra.signoff) items.push({ kind: "signoff", label: extra.signoff });
  return { items };
}

function drawTableHeader(flow: Flow, columns: Column[]) {
  const h = 14;
  flow.page.drawRectangle({ x: LEFT, y: flow.y - h, width: CONTENT_W, height: h, color: STEEL_WASH });
  let x = LEFT;
  for (const c of columns) {
    const style = { font: flow.fonts.semibold, size: 7, color: STEEL };
    if (c.align === "right") flow.text(c.title, x + c.width - CELL_PAD_X, flow.y - 9.5, style, "right");
    else flow.text(c.title, x + CELL_PAD_X, flow.y - 9.5, style);
    x += c.width;
  }
  flow.page.drawLine({
    start: { x: LEFT, y: flow.y - h },
    end: { x: RIGHT, y: flow.y - h },
    thickness: 0.8,
    color: STEEL,
  });
  flow.y -= h;
}

function drawRowPart(flow: Flow, columns: Column[], cells: Cell[], height: number, accent: RGB | null) {
  let x = LEFT;
  const yTop = flow.y;
  if (accent) flow.page.drawRectangle({ x: LEFT, y: yTop - height, width: 2.2, height, color: accent });
  columns.forEach((c, i) => {
    let y = yTop - CELL_PAD_Y;
    for (const item of cells[i]?.items ?? []) {
      if (item.kind === "line") {
        const size = item.style.size;
        const textX =
          c.align === "right"
            ? x + c.width - CELL_PAD_X - flow.ts.width(item.text, item.style.font, size)
            : x + CELL_PAD_X;
        flow.page.drawText(item.text, {
          x: textX,
          y: y - size * 1.02,
          size,
          font: item.style.font,
          color: item.style.color,
        });
      } else if (item.kind === "tag") {
        drawTag(flow.page, flow.ts, flow.fonts.semibold, item.text, item.tone, x + CELL_PAD_X, y - 1);
      } else {
        const labelStyle = { font: flow.fonts.regular, size: 6.5, color: INK_SOFT };
        flow.text(item.label, x + CELL_PAD_X, y - 13, labelStyle);
        const start = x + CELL_PAD_X + flow.ts.width(flow.ts.clean(item.label), labelStyle.font, 6.5) + 4;
        flow.page.drawLine({
          start: { x: start, y: y - 13.5 },
          end: { x: x + c.width - CELL_PAD_X, y: y - 13.5 },
          thickness: 0.5,
          color: INK_SOFT,
        });
      }
      y -= itemHeight(item);
    }
    x += c.width;
  });
  flow.page.drawLine({
    start: { x: LEFT, y: yTop - height },
    end: { x: RIGHT, y: yTop - height },
    thickness: 0.4,
    color: RULE,
  });
  flow.y -= height;
}

/**
 * A table that flows across pages: the column header repeats on every page, and a row too tall for
 * what is left of a page goes to the next one (or, if taller than a whole page, is split by lines).
 */
export function table(
  flow: Flow,
  columns: Column[],
  rows: Array<{ cells: Cell[]; accent?: RGB }>,
  continued: string,
  opts: { keepTogether?: boolean } = {},
) {
  const headerH = 14;
  const rowHeight = (cells: Cell[]) =>
    Math.max(...cells.map((c) => c.items.reduce((s, it) => s + itemHeight(it), 0))) + 2 * CELL_PAD_Y;
  const total = headerH + rows.reduce((s, r) => s + rowHeight(r.cells), 0);
  if (opts.keepTogether && total <= flow.pageRoom) flow.ensure(total);
  const continuedTitle = () => {
    flow.y -= 12;
    flow.text(`${continued} (continued)`, LEFT, flow.y, { font: flow.fonts.semibold, size: 8, color: STEEL });
    flow.y -= 4;
  };
  flow.ensure(headerH + (rows[0] ? Math.min(rowHeight(rows[0].cells), 60) : 0));
  drawTableHeader(flow, columns);
  for (const row of rows) {
    let cells = row.cells;
    for (;;) {
      const h = rowHeight(cells);
      if (h <= flow.room) {
        drawRowPart(flow, columns, cells, h, row.accent ?? null);
        break;
      }
      const fresh = flow.pageRoom - headerH - 16;
      if (h <= fresh || flow.room < 40) {
        flow.newPage();
        continuedTitle();
        drawTableHeader(flow, columns);
        continue;
      }
      // Taller than what is left: fill this page with as many lines as fit, carry the rest over.
      const budget = flow.room - 2 * CELL_PAD_Y;
      const head: Cell[] = [];
      const tail: Cell[] = [];
      for (const c of cells) {
        let used = 0;
        let k = 0;
        while (k < c.items.length && used + itemHeight(c.items[k]!) <= budget) used += itemHeight(c.items[k++]!);
        head.push({ items: c.items.slice(0, k) });
        tail.push({ items: c.items.slice(k) });
      }
      drawRowPart(flow, columns, head, rowHeight(head), row.accent ?? null);
      cells = tail;
      flow.newPage();
      continuedTitle();
      drawTableHeader(flow, columns);
    }
  }
  flow.y -= 6;
}
