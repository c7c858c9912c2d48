/**
 * Static SVG charts for the printed stone pages: axes with round ticks, lines and points,
 * and arrows. Pure string output, so a page prints the same in any browser, with no script.
 * Tick steps follow the usual 1-2-5 rule (common practice).
 *
 * @module
 */
import { escapeHtml as e } from "./escape.ts";

/** One data series of a plot. */
export interface SvgSeries {
  /** Points [x, y] in data units. */
  points: [number, number][];
  /** Stroke or fill colour (CSS). */
  color: string;
  /** `line` joins the points, `points` marks each, `arrow` draws from the first to the last. */
  kind: "line" | "points" | "arrow";
  /** Legend text (omitted from the legend when empty). */
  label?: string;
  /** Dash pattern for lines, e.g. "5 3". */
  dash?: string;
  /** Line width or point radius, px. */
  size?: number;
  /** Axis the series uses: the left one (default) or a second one on the right. */
  axis?: "left" | "right";
  /** A line drawn alike on many charts (the spectral locus): shared through {@linkcode SvgDefs}. */
  shared?: boolean;
}

/** A whole plot. */
export interface SvgPlot {
  /** Unique within the page (names the clip path). */
  id: string;
  /** Accessible name of the chart. */
  title: string;
  xLabel: string;
  yLabel: string;
  x: [number, number];
  y: [number, number];
  /** Range of the right-hand axis, when some series use it. */
  y2?: [number, number];
  y2Label?: string;
  series: SvgSeries[];
  /** Keep one data unit the same length on both axes (a*b*, chromaticity). */
  square?: boolean;
  /** x ranges shaded grey behind the series (e.g. stretches left out of a fit). */
  spans?: { from: number; to: number }[];
}

const W = 360, H = 250;
const PAD = { left: 46, right: 14, top: 10, bottom: 56 };

/** Round tick values covering [lo, hi], about `count` of them (1-2-5 steps). */
export function niceTicks(lo: number, hi: number, count = 5): number[] {
  if (!(hi > lo)) return [lo];
  const raw = (hi - lo) / count;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * mag).find((s) => s >= raw) ?? 10 * mag;
  const out: number[] = [];
  for (let v = Math.ceil(lo / step - 1e-9) * step; v <= hi + step * 1e-9; v += step) {
    out.push(Number(v.toPrecision(12)));
  }
  return out;
}

/** The range of finite values, widened a little; [0, 1] when there are none. */
export function paddedRange(values: number[], pad = 0.05): [number, number] {
  let lo = Infinity, hi = -Infinity;
  for (const v of values) {
    if (!Number.isFinite(v)) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (lo === Infinity) return [0, 1];
  if (hi === lo) return [lo - 1, hi + 1];
  const d = (hi - lo) * pad;
  return [lo - d, hi + d];
}

/** Largest distance (px) a drawn line may stray from the data (our choice: a quarter of the
 * thinnest stroke drawn, 0.8 px). */
const LINE_TOLERANCE_PX = 0.2;

/**
 * The points of a line that matter at a drawing tolerance (Ramer 1972; Douglas & Peucker
 * 1973): every dropped point lies within `tolerance` of the kept line, so the drawn line is the
 * same to that tolerance. Points are in drawing units (px); the first and last are always kept.
 */
export function simplifyLine(points: [number, number][], tolerance: number): [number, number][] {
  const n = points.length;
  if (n <= 2) return points;
  const keep = new Uint8Array(n);
  keep[0] = keep[n - 1] = 1;
  const stack: number[] = [0, n - 1];
  while (stack.length) {
    const last = stack.pop()!, first = stack.pop()!;
    const [ax, ay] = points[first]!, [bx, by] = points[last]!;
    const dx = bx - ax, dy = by - ay, length2 = dx * dx + dy * dy;
    let worst = -1, worstAt = -1;
    for (let i = first + 1; i < last; i++) {
      const [px, py] = points[i]!;
      // distance to the segment (to the end point when the foot falls outside it)
      let t = length2 > 0 ? ((px - ax) * dx + (py - ay) * dy) / length2 : 0;
      t = t < 0 ? 0 : t > 1 ? 1 : t;
      const ex = ax + t * dx - px, ey = ay + t * dy - py, d2 = ex * ex + ey * ey;
      if (d2 > worst) {
        worst = d2;
        worstAt = i;
      }
    }
    if (worstAt >= 0 && worst > tolerance * tolerance) {
      keep[worstAt] = 1;
      stack.push(first, worstAt, worstAt, last);
    }
  }
  return points.filter((_, i) => keep[i] === 1);
}

const f = (v: number) => (Math.round(v * 10) / 10).toString();

/** Drawing frame of a plot: inner size and the data → px maps. */
function frame(plot: SvgPlot) {
  const [x0, x1] = plot.x, [y0, y1] = plot.y;
  let iw = W - PAD.left - PAD.right - (plot.y2 ? 34 : 0), ih = H - PAD.top - PAD.bottom;
  if (plot.square) {
    // equal units: shrink the longer side's pixels
    const ux = iw / (x1 - x0), uy = ih / (y1 - y0);
    if (ux > uy) iw = uy * (x1 - x0);
    else ih = ux * (y1 - y0);
  }
  const left = PAD.left, top = PAD.top;
  const sx = (v: number) => left + ((v - x0) / (x1 - x0)) * iw;
  const sy = (v: number, right = false) => {
    const [a, b] = right && plot.y2 ? plot.y2 : [y0, y1];
    return top + ih - ((v - a) / (b - a)) * ih;
  };
  return { x0, x1, y0, y1, iw, ih, left, top, sx, sy };
}

/** A line series as a path, simplified to the drawing tolerance; "" with < 2 points. */
function linePath(s: SvgSeries, geometry: ReturnType<typeof frame>): string {
  const right = s.axis === "right";
  const pts = s.points.filter(([a, b]) => Number.isFinite(a) && Number.isFinite(b));
  if (pts.length < 2) return "";
  const { sx, sy } = geometry;
  const kept = simplifyLine(pts.map(([a, b]) => [sx(a), sy(b, right)]), LINE_TOLERANCE_PX);
  return `<path fill="none" stroke="${e(s.color)}" stroke-width="${s.size ?? 1.4}"${
    s.dash ? ` stroke-dasharray="${e(s.dash)}"` : ""
  } d="${pathData(kept)}"/>`;
}

/**
 * SVG path data through the points: an absolute move, then relative line steps between the
 * points rounded to 0.1 px (steps of rounded positions, so no rounding error accumulates).
 */
export function pathData(points: [number, number][]): string {
  const tenths = points.map(([x, y]) => [Math.round(x * 10), Math.round(y * 10)] as const);
  const [x0, y0] = tenths[0]!;
  let d = `M${tenthText(x0)} ${tenthText(y0)}l`;
  for (let i = 1; i < tenths.length; i++) {
    const dx = tenths[i]![0] - tenths[i - 1]![0], dy = tenths[i]![1] - tenths[i - 1]![1];
    const a = tenthText(dx), b = tenthText(dy);
    // a number needs a separator before it unless its sign (or the command letter) is one
    d += (i > 1 && a[0] !== "-" ? " " : "") + a + (b[0] === "-" ? "" : " ") + b;
  }
  return d;
}

/** A count of tenths as the shortest decimal text (12 → "1.2", −3 → "-.3", 40 → "4"). */
function tenthText(tenths: number): string {
  if (tenths === 0) return "0";
  const sign = tenths < 0 ? "-" : "", v = Math.abs(tenths);
  const whole = Math.floor(v / 10), frac = v % 10;
  return sign + (frac === 0 ? String(whole) : `${whole === 0 ? "" : whole}.${frac}`);
}

/**
 * Markup drawn alike on many charts of one page (a chart's frame, the spectral locus): each
 * chart holds a placeholder, and {@linkcode SvgDefs.resolve} then defines what occurs more than
 * once a single time on the page and draws it by reference (`<use>`), inlining the rest.
 */
export class SvgDefs {
  #ids = new Map<string, number>();
  #markup: string[] = [];
  /** A placeholder for the markup (a comment: escaped text can never contain one). */
  share(markup: string): string {
    let id = this.#ids.get(markup);
    if (id === undefined) {
      id = this.#markup.length;
      this.#ids.set(markup, id);
      this.#markup.push(markup);
    }
    return `<!--svg-def:${id}-->`;
  }
  /**
   * The text with its placeholders filled, and the definitions for one SVG of no size placed
   * on the page before them ("" when nothing repeats).
   */
  resolve(text: string): { text: string; defs: string } {
    const { texts: [filled], defs } = this.resolveAll([text]);
    return { text: filled!, defs };
  }
  /** As {@linkcode SvgDefs.resolve} for texts that go on one page together, each filled apart. */
  resolveAll(texts: string[]): { texts: string[]; defs: string } {
    const uses = new Uint32Array(this.#markup.length);
    const pattern = /<!--svg-def:(\d+)-->/g;
    for (const text of texts) for (const m of text.matchAll(pattern)) uses[Number(m[1])]!++;
    const filled = texts.map((text) =>
      text.replace(pattern, (_, id: string) => {
        const k = Number(id);
        return uses[k]! > 1 ? `<use href="#svg-def-${k}"/>` : this.#markup[k]!;
      })
    );
    const shared = this.#markup.map((m, k) => uses[k]! > 1 ? `<g id="svg-def-${k}">${m}</g>` : "")
      .join("");
    return {
      texts: filled,
      defs: shared
        ? `<svg class="plot shared-defs" aria-hidden="true" focusable="false" ` +
          `xmlns="http://www.w3.org/2000/svg"><defs>${shared}</defs></svg>`
        : "",
    };
  }
}

/**
 * Renders a plot as an SVG element (viewBox-sized, scales to its box). With `defs`, the frame
 * (box, grid, ticks, axis titles) and the shared lines go through it, to be drawn once per page.
 */
export function svgChart(plot: SvgPlot, defs?: SvgDefs): string {
  const geometry = frame(plot);
  const { x0, x1, y0, y1, iw, ih, left, top, sx, sy } = geometry;
  // the frame in two parts, box and x axis, and y axes, each shared on its own (charts of one
  // wavelength range share the first even when their y ranges differ)
  const xPart: string[] = [], yPart: string[] = [];
  xPart.push(
    `<rect x="${left}" y="${top}" width="${f(iw)}" height="${
      f(ih)
    }" fill="none" stroke="#c9c1b0"/>`,
  );
  for (const t of niceTicks(x0, x1)) {
    const X = f(sx(t));
    xPart.push(
      `<line x1="${X}" x2="${X}" y1="${top}" y2="${f(top + ih)}" stroke="#ece6da"/>` +
        `<text x="${X}" y="${f(top + ih + 13)}" text-anchor="middle">${e(tickText(t))}</text>`,
    );
  }
  for (const t of niceTicks(y0, y1)) {
    const Y = f(sy(t));
    yPart.push(
      `<line x1="${left}" x2="${f(left + iw)}" y1="${Y}" y2="${Y}" stroke="#ece6da"/>` +
        `<text x="${left - 4}" y="${f(sy(t) + 3.5)}" text-anchor="end">${e(tickText(t))}</text>`,
    );
  }
  if (plot.y2) {
    for (const t of niceTicks(plot.y2[0], plot.y2[1], 4)) {
      yPart.push(
        `<text x="${f(left + iw + 4)}" y="${f(sy(t, true) + 3.5)}">${e(tickText(t))}</text>`,
      );
    }
    yPart.push(
      `<text transform="translate(${f(left + iw + 44)} ${
        f(top + ih / 2)
      }) rotate(90)" text-anchor="middle">${e(plot.y2Label ?? "")}</text>`,
    );
  }
  xPart.push(
    `<text x="${f(left + iw / 2)}" y="${f(top + ih + 27)}" text-anchor="middle" class="axis">${
      e(plot.xLabel)
    }</text>`,
  );
  yPart.push(
    `<text transform="translate(11 ${
      f(top + ih / 2)
    }) rotate(-90)" text-anchor="middle" class="axis">${e(plot.yLabel)}</text>`,
  );
  const clip = `<clipPath id="clip-${e(plot.id)}"><rect x="${left}" y="${top}" width="${
    f(iw)
  }" height="${f(ih)}"/></clipPath>`;
  const body: string[] = [];
  for (const span of plot.spans ?? []) {
    const a = Math.max(x0, Math.min(span.from, span.to)),
      b = Math.min(x1, Math.max(span.from, span.to));
    if (!(b > a)) continue;
    body.push(
      `<rect class="excluded" x="${f(sx(a))}" y="${top}" width="${f(sx(b) - sx(a))}" height="${
        f(ih)
      }" fill="#d9d4ca" fill-opacity="0.6"/>`,
    );
  }
  for (const s of plot.series) {
    const right = s.axis === "right";
    const pts = s.points.filter(([a, b]) => Number.isFinite(a) && Number.isFinite(b));
    if (s.kind === "line") {
      const line = linePath(s, geometry);
      body.push(s.shared && defs && line ? defs.share(line) : line);
    } else if (s.kind === "points") {
      for (const [a, b] of pts) {
        body.push(
          `<circle cx="${f(sx(a))}" cy="${f(sy(b, right))}" r="${s.size ?? 3.5}" fill="${
            e(s.color)
          }"/>`,
        );
      }
    } else if (s.kind === "arrow" && pts.length >= 2) {
      const [a, b] = [pts[0]!, pts[pts.length - 1]!];
      const X1 = sx(a[0]), Y1 = sy(a[1]), X2 = sx(b[0]), Y2 = sy(b[1]);
      const ang = Math.atan2(Y2 - Y1, X2 - X1), h = 8;
      body.push(
        `<line x1="${f(X1)}" y1="${f(Y1)}" x2="${f(X2)}" y2="${f(Y2)}" stroke="${
          e(s.color)
        }" stroke-width="${s.size ?? 1.6}"/>` +
          `<polygon fill="${e(s.color)}" points="${f(X2)},${f(Y2)} ${
            f(X2 - h * Math.cos(ang - 0.4))
          },${f(Y2 - h * Math.sin(ang - 0.4))} ${f(X2 - h * Math.cos(ang + 0.4))},${
            f(Y2 - h * Math.sin(ang + 0.4))
          }"/>`,
      );
    }
  }
  // legend items flow left to right and wrap (label width estimated at 5.3 px per character)
  const legend: string[] = [];
  let lx = left, ly = top + ih + 41;
  for (const s of plot.series.filter((s) => s.label)) {
    const width = 18 + s.label!.length * 5.3 + 12;
    if (lx > left && lx + width > W - 4) {
      lx = left;
      ly += 12;
    }
    const mark = s.kind === "points"
      ? `<circle cx="${f(lx + 6)}" cy="${f(ly - 3.5)}" r="3.5" fill="${e(s.color)}"/>`
      : `<line x1="${f(lx)}" x2="${f(lx + 12)}" y1="${f(ly - 3.5)}" y2="${f(ly - 3.5)}" stroke="${
        e(s.color)
      }" stroke-width="2"${s.dash ? ` stroke-dasharray="${e(s.dash)}"` : ""}/>`;
    legend.push(`${mark}<text x="${f(lx + 16)}" y="${f(ly)}">${e(s.label)}</text>`);
    lx += width;
  }
  return `<svg class="plot" viewBox="0 0 ${W} ${H}" role="img" aria-label="${
    e(plot.title)
  }" xmlns="http://www.w3.org/2000/svg"><defs>${clip}</defs>${
    [xPart, yPart].map((part) => defs ? defs.share(part.join("")) : part.join("")).join("")
  }` +
    `<g clip-path="url(#clip-${e(plot.id)})">${body.join("")}</g>${legend.join("")}</svg>`;
}

function tickText(v: number): string {
  return Math.abs(v) >= 1000 || v === Math.round(v) ? String(v) : String(Number(v.toPrecision(3)));
}
