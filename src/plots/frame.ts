import { escapeXml } from '../common/xml-text';
import { formatTick, niceTicks, type Ticks } from './nice-ticks';
import { GRID, INK } from './palette';

/**
 * The parts every plot shares: the SVG root, title, legend, plot area, grid,
 * ticks, tick labels and axis labels. A plot asks for a frame with its data
 * ranges and legend, draws its marks with the frame's x() and y(), and
 * concatenates head + marks + tail.
 */

/** Options every plot takes. */
export interface PlotOptions {
  /** Width in px, 200..2000 (default 640; the task pane uses about 300). */
  readonly width?: number;
  /** Height in px, 150..2000 (default: 0.62 x width, at least 220). */
  readonly height?: number;
  readonly title?: string;
  readonly xLabel?: string;
  readonly yLabel?: string;
}

/** One legend entry: how the series is drawn. */
export interface LegendEntry {
  readonly name: string;
  readonly colour: string;
  readonly mark: 'line' | 'point' | 'box';
}

export interface Frame {
  readonly width: number;
  readonly height: number;
  readonly fontSize: number;
  /** Plot area in px. */
  readonly left: number;
  readonly right: number;
  readonly top: number;
  readonly bottom: number;
  readonly xTicks: Ticks;
  readonly yTicks: Ticks;
  /** Data to px. */
  x(v: number): number;
  y(v: number): number;
  /** Everything drawn before the marks (root, title, legend, grid, ticks, labels). */
  readonly head: string;
  /** The axis lines and the closing tag. */
  readonly tail: string;
}

/** A number written for SVG coordinates: two decimals at most, no trailing zeros. O(1). */
export function px(v: number): string {
  const r = Math.round(v * 100) / 100;
  return Object.is(r, -0) ? '0' : String(r);
}

/** Rough width of text in px at a font size (a mean glyph is about 0.58 em in sans-serif; common practice). */
export function textWidth(text: string, fontSize: number): number {
  return text.length * fontSize * 0.58;
}

function clampSize(v: number | undefined, fallback: number, lo: number, hi: number): number {
  if (v === undefined || !Number.isFinite(v)) return fallback;
  return Math.max(lo, Math.min(hi, Math.round(v)));
}

/**
 * Lays out a plot with data ranges [x0, x1] x [y0, y1] (widened to nice ticks)
 * and a legend that wraps onto as many lines as the width needs.
 * Cost: O(#ticks + #legend entries).
 * @example makeFrame({ width: 300 }, [0, 10], [0, 1], []).xTicks.values // [0, 2, 4, 6, 8, 10]
 */
export function makeFrame(
  opts: PlotOptions,
  xRange: readonly [number, number],
  yRange: readonly [number, number],
  legend: readonly LegendEntry[],
  fixedY?: Ticks,
): Frame {
  const width = clampSize(opts.width, 640, 200, 2000);
  const height = clampSize(opts.height, Math.max(220, Math.round(width * 0.62)), 150, 2000);
  const fontSize = width < 420 ? 10 : 12;
  const line = Math.round(fontSize * 1.5);
  const xTicks = niceTicks(xRange[0], xRange[1], Math.max(3, Math.floor(width / 90)));
  const yTicks = fixedY ?? niceTicks(yRange[0], yRange[1], Math.max(3, Math.floor(height / 60)));
  const yLabels = yTicks.values.map((v) => formatTick(v, yTicks.step));
  const yLabelWidth = Math.max(...yLabels.map((t) => textWidth(t, fontSize)));

  // legend lines, wrapped to the width
  const pad = 8;
  const entryWidth = (e: LegendEntry) => 16 + 4 + textWidth(e.name, fontSize) + 12;
  const rows: LegendEntry[][] = [];
  let used = Infinity;
  for (const e of legend) {
    const w = entryWidth(e);
    if (used + w > width - 2 * pad) {
      rows.push([]);
      used = 0;
    }
    rows[rows.length - 1].push(e);
    used += w;
  }

  const titleH = opts.title ? line + 2 : 0;
  const top = pad + titleH + rows.length * line + 6;
  const left = pad + (opts.yLabel ? line : 0) + yLabelWidth + 6;
  const bottom = height - pad - (opts.xLabel ? line : 0) - fontSize - 8;
  const right = width - pad - Math.min(textWidth(formatTick(xTicks.hi, xTicks.step), fontSize) / 2, 24);
  const x = (v: number) => left + ((v - xTicks.lo) / (xTicks.hi - xTicks.lo)) * (right - left);
  const y = (v: number) => bottom - ((v - yTicks.lo) / (yTicks.hi - yTicks.lo)) * (bottom - top);

  const parts: string[] = [];
  const label = escapeXml(opts.title ?? 'plot');
  parts.push(
    `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" role="img" aria-label="${label}" font-family="Segoe UI, Helvetica, Arial, sans-serif" font-size="${fontSize}">`,
  );
  parts.push(`<title>${label}</title>`);
  parts.push(`<rect x="0" y="0" width="${width}" height="${height}" fill="#FFFFFF"/>`);
  if (opts.title)
    parts.push(
      `<text x="${px(width / 2)}" y="${px(pad + fontSize + 1)}" text-anchor="middle" font-weight="bold" fill="${INK}">${escapeXml(opts.title)}</text>`,
    );
  let ly = pad + titleH + line / 2;
  for (const row of rows) {
    let lx = pad;
    for (const e of row) {
      parts.push(swatch(e, lx, ly));
      parts.push(`<text x="${px(lx + 20)}" y="${px(ly + fontSize * 0.35)}" fill="${INK}">${escapeXml(e.name)}</text>`);
      lx += entryWidth(e);
    }
    ly += line;
  }
  // grid and ticks
  for (let i = 0; i < yTicks.values.length; i++) {
    const yy = y(yTicks.values[i]);
    parts.push(`<line x1="${px(left)}" y1="${px(yy)}" x2="${px(right)}" y2="${px(yy)}" stroke="${GRID}" stroke-width="1"/>`);
    parts.push(`<text x="${px(left - 5)}" y="${px(yy + fontSize * 0.35)}" text-anchor="end" fill="${INK}">${escapeXml(yLabels[i])}</text>`);
  }
  for (const v of xTicks.values) {
    const xx = x(v);
    parts.push(`<line x1="${px(xx)}" y1="${px(top)}" x2="${px(xx)}" y2="${px(bottom)}" stroke="${GRID}" stroke-width="1"/>`);
    parts.push(`<line x1="${px(xx)}" y1="${px(bottom)}" x2="${px(xx)}" y2="${px(bottom + 4)}" stroke="${INK}" stroke-width="1"/>`);
    parts.push(`<text x="${px(xx)}" y="${px(bottom + 6 + fontSize)}" text-anchor="middle" fill="${INK}">${escapeXml(formatTick(v, xTicks.step))}</text>`);
  }
  if (opts.xLabel)
    parts.push(`<text x="${px((left + right) / 2)}" y="${px(height - pad)}" text-anchor="middle" fill="${INK}">${escapeXml(opts.xLabel)}</text>`);
  if (opts.yLabel) {
    const cx = pad + fontSize;
    const cy = (top + bottom) / 2;
    parts.push(
      `<text x="${px(cx)}" y="${px(cy)}" text-anchor="middle" transform="rotate(-90 ${px(cx)} ${px(cy)})" fill="${INK}">${escapeXml(opts.yLabel)}</text>`,
    );
  }
  const tail = `<path d="M${px(left)} ${px(top)}V${px(bottom)}H${px(right)}" fill="none" stroke="${INK}" stroke-width="1"/>` + '</svg>';
  return { width, height, fontSize, left, right, top, bottom, xTicks, yTicks, x, y, head: parts.join(''), tail };
}

function swatch(e: LegendEntry, x: number, y: number): string {
  if (e.mark === 'point') return `<circle cx="${px(x + 8)}" cy="${px(y)}" r="3.5" fill="${e.colour}"/>`;
  if (e.mark === 'box')
    return `<rect x="${px(x + 2)}" y="${px(y - 5)}" width="12" height="10" fill="${e.colour}" fill-opacity="0.35" stroke="${e.colour}" stroke-width="1.5"/>`;
  return `<line x1="${px(x)}" y1="${px(y)}" x2="${px(x + 16)}" y2="${px(y)}" stroke="${e.colour}" stroke-width="2.5"/>`;
}
