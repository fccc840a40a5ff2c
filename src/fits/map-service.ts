import type { Mapped, TransportMap } from '../engine/map';
import type { Points } from '../engine/points';
import type { MaybePromise } from './maybe-promise';

/**
 * Where fitted maps are applied to values: on this thread by default; in the add-in, heavy calls (an entropic map
 * applied to many rows, say) go to the fit workers in pieces of rows (`workerMapper`), so Excel's page never blocks
 * and the pieces run at once on several cores. Every mapper gives the same numbers: rows are mapped one by one.
 */
export type Mapper = (map: TransportMap, points: Points, verb: 'apply' | 'invert') => MaybePromise<Mapped>;

/** Maps on this thread. */
export const mapInThisThread: Mapper = (map, points, verb) => (verb === 'apply' ? map.apply(points) : map.invert(points));

let current: Mapper = mapInThisThread;

/** Sets where maps are applied (null: this thread). */
export function setMapper(m: Mapper | null): void {
  current = m ?? mapInThisThread;
}

/**
 * The map applied to (or inverted at) the points by the current mapper.
 * @example mapPoints(map, column([1, 2]), 'apply') // the mapped points, or a Promise of them
 */
export function mapPoints(map: TransportMap, points: Points, verb: 'apply' | 'invert'): MaybePromise<Mapped> {
  return current(map, points, verb);
}
