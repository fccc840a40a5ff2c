import { BaseMap, jsonHeader, type MapHeader } from '../base';
import { RemapError } from '../errors';
import type { FitRecord, MapJSON, Mapped } from '../map';
import type { Points } from '../points';
import { affineApply } from './affine-apply';

/** The fitted parameters of a linear map, as stored in its JSON (`params`). */
export interface LinearParams {
  /** Source mean m1 and target mean m2 (length d). */
  readonly mean1: readonly number[];
  readonly mean2: readonly number[];
  /** Covariances the map was fitted to (ridge included), row-major d x d. */
  readonly cov1: readonly number[];
  readonly cov2: readonly number[];
  /** A and A^-1, row-major d x d. */
  readonly matrix: readonly number[];
  readonly inverse: readonly number[];
  /** Per-column range of the fitted source and target (rows of positive weight). */
  readonly sourceMin: readonly number[];
  readonly sourceMax: readonly number[];
  readonly targetMin: readonly number[];
  readonly targetMax: readonly number[];
}

const VECTOR_FIELDS = ['mean1', 'mean2', 'sourceMin', 'sourceMax', 'targetMin', 'targetMax'] as const;
const MATRIX_FIELDS = ['cov1', 'cov2', 'matrix', 'inverse'] as const;

/**
 * A fitted linear (Gaussian) transport map T(x) = m2 + A (x - m1) with A
 * symmetric positive definite, so T is the gradient of a convex quadratic and
 * monotone. Inverse: T^-1(y) = m1 + A^-1 (y - m2), exact for every point.
 * The `tails` setting does not change a linear map: it is defined on all of
 * R^d and extends past the fitted range as the same affine function; rows
 * outside the range are only counted (`Mapped.outside`, the extrapolation warning).
 * Apply and invert cost O(n d^2). Built by `fitLinear` or `LinearMap.fromJSON`;
 * both give bit-identical results for the same parameters.
 */
export class LinearMap extends BaseMap {
  private readonly p: { [K in keyof LinearParams]: Float64Array };

  constructor(header: MapHeader, fitted: FitRecord, params: { readonly [K in keyof LinearParams]: ArrayLike<number> }) {
    super(header, fitted);
    const copy = {} as { -readonly [K in keyof LinearParams]: Float64Array };
    // `+ 0` turns -0 into 0, which JSON cannot keep apart; the fitted and restored maps then hold the same bits.
    for (const f of [...VECTOR_FIELDS, ...MATRIX_FIELDS]) copy[f] = Float64Array.from(params[f], (v) => v + 0);
    this.p = copy;
  }

  /** m1, m2, A, A^-1 and the fitted ranges, as fresh copies. */
  get parameters(): LinearParams {
    return this.params();
  }

  protected applyPoints(x: Points): Mapped {
    const p = this.p;
    return affineApply(x, p.mean1, p.matrix, p.mean2, p.sourceMin, p.sourceMax, 'apply');
  }

  protected invertPoints(y: Points): Mapped {
    const p = this.p;
    return affineApply(y, p.mean2, p.inverse, p.mean1, p.targetMin, p.targetMax, 'invert');
  }

  protected params(): LinearParams {
    const p = this.p;
    const out: Record<keyof LinearParams, number[]> = {} as Record<keyof LinearParams, number[]>;
    for (const f of [...VECTOR_FIELDS, ...MATRIX_FIELDS]) out[f] = Array.from(p[f]);
    return out;
  }

  /**
   * Restores a linear map from `toJSON()` output (envelope already checked by
   * parseMapJSON). Cost O(d^2).
   * @throws RemapError if `params` lacks a field or has a field of the wrong length or a non-finite number.
   * @example LinearMap.fromJSON(map.toJSON()).apply(x) // the same numbers, bit for bit, as map.apply(x)
   */
  static fromJSON(json: MapJSON): LinearMap {
    const d = json.d;
    const raw = json.params as Record<string, unknown> | null;
    const bad = (what: string): never => {
      throw new RemapError(`Map JSON (linear): ${what}; give the exact text REMAP.SAVE or \`remap fit --out\` wrote.`);
    };
    if (typeof raw !== 'object' || raw === null || Array.isArray(raw)) bad('"params" is not an object');
    const params = {} as Record<keyof LinearParams, number[]>;
    for (const f of [...VECTOR_FIELDS, ...MATRIX_FIELDS]) {
      const want = (MATRIX_FIELDS as readonly string[]).includes(f) ? d * d : d;
      const v = (raw as Record<string, unknown>)[f];
      if (!Array.isArray(v) || v.length !== want) bad(`"params.${f}" is not a list of ${want} numbers`);
      for (const x of v as unknown[]) if (typeof x !== 'number' || !Number.isFinite(x)) bad(`"params.${f}" holds a value that is not a finite number`);
      params[f] = v as number[];
    }
    const header = jsonHeader(json);
    return new LinearMap(header, json.fitted, params);
  }
}
