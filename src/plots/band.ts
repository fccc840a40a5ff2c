import { escapeXml } from '../common/xml-text';
import { px, type Frame } from './frame';

/** A band in data coordinates: at each x, a lower and an upper y (e.g. bounds on mapped values). */
export interface Band {
  readonly name: string;
  /** The series the band belongs to (it takes that series' colour); the first series when absent or not found. */
  readonly of?: string;
  readonly x: ArrayLike<number>;
  readonly lower: ArrayLike<number>;
  readonly upper: ArrayLike<number>;
}

/**
 * The band as one closed `<path class="band">`: along the upper ends from left
 * to right, back along the lower ends, filled translucently in `colour`.
 * Points whose x, lower or upper is not finite are left out. O(k) for k points.
 * @throws Error when x, lower and upper differ in length.
 * @example bandPath(frame, { name: '95 % bounds', x: [0, 1], lower: [0, 1], upper: [1, 2] }, '#888') // '<path class="band" ...'
 */
export function bandPath(f: Frame, band: Band, colour: string): string {
  const k = band.x.length;
  if (band.lower.length !== k || band.upper.length !== k) {
    throw new Error(`plot: band "${band.name}" has ${k} x values, ${band.lower.length} lower and ${band.upper.length} upper ends; give one of each per x.`);
  }
  const idx: number[] = [];
  for (let i = 0; i < k; i++) if (Number.isFinite(band.x[i]) && Number.isFinite(band.lower[i]) && Number.isFinite(band.upper[i])) idx.push(i);
  idx.sort((a, b) => band.x[a] - band.x[b]);
  if (idx.length < 2) return '';
  const top = idx.map((i, j) => `${j === 0 ? 'M' : 'L'}${px(f.x(band.x[i]))} ${px(f.y(band.upper[i]))}`).join('');
  const bottom = [...idx]
    .reverse()
    .map((i) => `L${px(f.x(band.x[i]))} ${px(f.y(band.lower[i]))}`)
    .join('');
  return `<path class="band" data-name="${escapeXml(band.name)}" d="${top}${bottom}Z" fill="${colour}" fill-opacity="0.22" stroke="none"/>`;
}
