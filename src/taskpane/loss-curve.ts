import { escapeXml } from '../common/xml-text';

/**
 * A small line of a fit's loss against its step, drawn as SVG text for the
 * progress area (no axes; the first and last values are written beside it).
 * A logarithmic scale is used when every loss is positive and they span more
 * than a factor of 10. Pure; O(points).
 * @param points (step, loss) pairs in order; non-finite losses are left out.
 * @example lossCurve([[1, 2], [2, 1]], 280, 64) // '<svg ...><polyline .../>...</svg>'
 */
export function lossCurve(points: readonly (readonly [number, number])[], width = 280, height = 64): string {
  const pts = points.filter(([s, l]) => Number.isFinite(s) && Number.isFinite(l));
  const head = `<svg xmlns="http://www.w3.org/2000/svg" class="loss-curve" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" role="img" aria-label="Loss by step">`;
  if (pts.length < 2) return `${head}<text x="4" y="${height / 2}" font-size="11" fill="#5f6b6d">The loss curve appears after two reports.</text></svg>`;
  const log = pts.every(([, l]) => l > 0) && Math.max(...pts.map(([, l]) => l)) / Math.min(...pts.map(([, l]) => l)) > 10;
  const f = (l: number) => (log ? Math.log10(l) : l);
  const x0 = pts[0][0];
  const x1 = pts[pts.length - 1][0];
  const ys = pts.map(([, l]) => f(l));
  const y0 = Math.min(...ys);
  const y1 = Math.max(...ys);
  const left = 4;
  const right = width - 4;
  const top = 6;
  const bottom = height - 16;
  const px = (s: number) => left + ((s - x0) / (x1 - x0 || 1)) * (right - left);
  const py = (y: number) => bottom - ((y - y0) / (y1 - y0 || 1)) * (bottom - top);
  const line = pts.map(([s, l]) => `${px(s).toFixed(1)},${py(f(l)).toFixed(1)}`).join(' ');
  const label = `loss ${fmt(pts[0][1])} \u2192 ${fmt(pts[pts.length - 1][1])}${log ? ' (log scale)' : ''}`;
  return (
    `${head}<rect x="0" y="0" width="${width}" height="${height}" fill="#fafafa" stroke="#e1e1e1"/><polyline fill="none" stroke="#106e78" ` +
    `stroke-width="1.5" points="${line}"/><text x="${left}" y="${height - 4}" font-size="11" fill="#424242">${escapeXml(label)}</text></svg>`
  );
}

function fmt(v: number): string {
  return Math.abs(v) >= 1e4 || (Math.abs(v) < 1e-3 && v !== 0) ? v.toExponential(2) : v.toPrecision(3);
}
