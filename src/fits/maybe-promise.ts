/** A result that is there at once (a quick fit, a map already known) or later (a fit running in the background). */
export type MaybePromise<T> = T | Promise<T>;

/**
 * Applies `f` to a value now, or when its promise settles, keeping a synchronous
 * result synchronous (a worksheet cell then shows it in the same calculation).
 * `f` may itself answer now or later. O(1) besides `f`.
 * @example then(2, (x) => x + 1) // 3
 */
export function then<T, U>(v: MaybePromise<T>, f: (t: T) => MaybePromise<U>): MaybePromise<U> {
  return v instanceof Promise ? v.then(f) : f(v);
}
