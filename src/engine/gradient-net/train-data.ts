/** Row-major standardised data of one sample, as the trainer reads it. */
export interface TrainData {
  readonly n: number;
  readonly d: number;
  readonly data: Float64Array;
  readonly weights: Float64Array | null;
}
