import type { Objective } from './objective';

/**
 * Regression onto a given map: loss = mean over the batch of |F(x_b) - t(x_b)|^2
 * (summed over columns), gradient 2 (F(x_b) - t(x_b)) / batch. The targets come
 * from `targetsOf(rows)` (row-major, one row per index), e.g. the entropic
 * teacher's map at those source rows. Cost O(batch d) plus the targets' cost.
 * @example new RegressionObjective((rows) => teacherAt(rows)).evaluate(mapped, rows).value // 0.03
 */
export class RegressionObjective implements Objective {
  readonly describe: string;
  private readonly targetsOf: (rows: Uint32Array) => Float64Array;

  constructor(targetsOf: (rows: Uint32Array) => Float64Array, describe = 'mean squared distance to the teacher map') {
    this.targetsOf = targetsOf;
    this.describe = describe;
  }

  evaluate(mapped: Float64Array, rows: Uint32Array): { value: number; gradient: Float64Array } {
    const t = this.targetsOf(rows);
    const b = rows.length;
    const gradient = new Float64Array(mapped.length);
    let value = 0;
    for (let i = 0; i < mapped.length; i++) {
      const e = mapped[i] - t[i];
      value += e * e;
      gradient[i] = (2 * e) / b;
    }
    return { value: value / b, gradient };
  }
}
