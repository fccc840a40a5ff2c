/**
 * What one training step minimises, seen from the mapped batch: the loss of the
 * network's outputs F(x_b) for the source rows `rows`, and its gradient with
 * respect to those outputs (n x d, row-major, float64). The trainer turns the
 * gradient into a parameter gradient by the chain rule (train.ts), so an
 * objective never touches tensors.
 */
export interface Objective {
  /** One line for the convergence record, e.g. "mean squared distance to the teacher map". */
  readonly describe: string;
  evaluate(mapped: Float64Array, rows: Uint32Array): { readonly value: number; readonly gradient: Float64Array };
}
