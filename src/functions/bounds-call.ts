import { RemapError } from '../engine/errors';
import { bootstrapBounds } from '../engine/uncertainty/bootstrap-bounds';
import type { MappedBounds } from '../engine/uncertainty/mapped-bounds';
import { replicateBounds, type ReplicateWeights } from '../engine/uncertainty/replicate-bounds';
import type { ReplicateKind } from '../engine/uncertainty/replicate-variance';
import { asRows, cellKind, CellError, isOmitted, readSettings, readText, readValues, type CellIn, type CellOut, type Grid, type ReadSample } from '../input';
import { readFit } from '../fits';
import { checkPayload } from './calls';

/**
 * REMAP.BOUNDS: for each value, the mapped value and a lower and upper bound
 * at `level` (default 0.95): three columns per value column (mapped, lower,
 * upper; for several columns, every column's mapped values, then the lower,
 * then the upper). By default a seeded bootstrap (settings seed=..., default
 * 0, and replicates=..., default 1000); with replicate weight ranges, the
 * variance formula of `replicate_kind` (bootstrap, jackknife, brr with
 * settings fay=..., custom with multiplier=...; shared=yes pairs replicate r
 * of both samples). The engine's bootstrapBounds and replicateBounds hold the
 * formulas and their sources. Bounds settings are taken out of `settings`
 * before the method sees the rest.
 * Cost: replicates x one refit (see bootstrapBounds).
 * @throws RemapError for bad input, naming the argument.
 */
export function bounds(
  vals: CellIn,
  source: CellIn,
  target: CellIn,
  method?: CellIn,
  settings?: CellIn,
  sourceWeights?: CellIn,
  targetWeights?: CellIn,
  level?: CellIn,
  replicatesSource?: CellIn,
  replicatesTarget?: CellIn,
  replicateKind?: CellIn,
): Grid {
  const fn = 'REMAP.BOUNDS';
  const all = readSettings(settings, fn);
  const own: Record<string, unknown> = {};
  const rest: [string, unknown][] = [];
  for (const [k, v] of Object.entries(all)) {
    const name = k.trim().toLowerCase().replace(/-/g, '_');
    if (BOUND_SETTINGS.includes(name)) own[name] = v;
    else rest.push([k, v]);
  }
  const inputs = readFit(fn, { source, target, method, settings: rest.length > 0 ? rest : undefined, sourceWeights, targetWeights });
  const d = inputs.source.sample.d;
  const { points, layout } = readValues(vals, d, fn);
  if (d === 1 && layout.cols !== 1) throw new RemapError(`${fn}: the values have ${layout.cols} columns; give one column of values (one bound row each).`);
  const lvl = isOmitted(level) ? 0.95 : numberArg(level, 'level', fn);
  let b: MappedBounds | null = null;
  if (points.n > 0) {
    const sRep = isOmitted(replicatesSource) ? undefined : readReplicates(replicatesSource, source, inputs.source, 'replicates_source', replicateKind, own, fn);
    const tRep = isOmitted(replicatesTarget) ? undefined : readReplicates(replicatesTarget, target, inputs.target, 'replicates_target', replicateKind, own, fn);
    if (sRep || tRep) {
      b = replicateBounds(inputs.method, inputs.source.sample, inputs.target.sample, points, {
        source: sRep,
        target: tRep,
        shared: own.shared !== undefined && /^(yes|true|1)$/i.test(String(own.shared).trim()),
        level: lvl,
        settings: inputs.settings,
      });
    } else {
      b = bootstrapBounds(inputs.method, inputs.source.sample, inputs.target.sample, points, {
        level: lvl,
        replicates: own.replicates !== undefined ? numberArg(own.replicates, 'the replicates setting', fn) : undefined,
        seed: own.seed !== undefined ? numberArg(own.seed, 'the seed setting', fn) : undefined,
        settings: inputs.settings,
      });
    }
  }
  const out: Grid = [];
  for (let i = 0; i < layout.rows; i++) {
    const s = layout.slots[i];
    if (s < 0 || !b) {
      out.push(new Array(3 * d).fill(layout.reasons[i] ?? ''));
      continue;
    }
    const row: CellOut[] = [];
    for (const part of [b.estimate, b.lower, b.upper]) for (let k = 0; k < d; k++) row.push(finite(part[s * d + k]));
    out.push(row);
  }
  return checkPayload(out, fn);
}

/** Settings REMAP.BOUNDS reads itself; the rest go to the method. */
export const BOUND_SETTINGS: readonly string[] = ['seed', 'replicates', 'fay', 'multiplier', 'shared'];

const KINDS: readonly ReplicateKind[] = ['bootstrap', 'jackknife', 'brr', 'custom'];

/** Replicate weights: as tall as the sample's range (a header row allowed), one column per replicate; read for the rows the sample kept. */
function readReplicates(
  cells: CellIn,
  dataCells: CellIn,
  read: ReadSample,
  name: string,
  kindCell: CellIn,
  own: Record<string, unknown>,
  fn: string,
): ReplicateWeights {
  const kind = readText(kindCell, 'replicate_kind', fn, 'bootstrap').toLowerCase() as ReplicateKind;
  if (!KINDS.includes(kind)) throw new RemapError(`${fn}: replicate_kind is "${kind}"; give bootstrap, jackknife, brr or custom.`);
  const rows = asRows(cells);
  const dataRows = asRows(dataCells);
  const height = dataRows.length === 1 && dataRows[0].length > 1 ? dataRows[0].length : dataRows.length;
  const shift = rows.length === height - 1 && read.columns ? -1 : 0;
  if (shift === 0 && rows.length !== height) {
    throw new RemapError(`${fn}: ${name} has ${rows.length} rows but its sample's range has ${height}; give one row of replicate weights per sample row.`);
  }
  const R = rows[0]?.length ?? 0;
  if (R < 2) throw new RemapError(`${fn}: ${name} has ${R} column; give one column per replicate (at least 2).`);
  const n = read.rows.length;
  const data = new Float64Array(n * R);
  for (let i = 0; i < n; i++) {
    const r = read.rows[i] + shift;
    for (let j = 0; j < R; j++) {
      const v = rows[r][j];
      if (cellKind(v) !== 'number')
        throw new RemapError(`${fn}: ${name} in row ${r + 1}, column ${j + 1} is not a number (${String(v)}); every replicate weight must be a number.`);
      data[i * R + j] = v as number;
    }
  }
  return {
    kind,
    weights: { n, d: R, data },
    fay: own.fay !== undefined ? numberArg(own.fay, 'the fay setting', fn) : undefined,
    multiplier: own.multiplier !== undefined ? numberArg(own.multiplier, 'the multiplier setting', fn) : undefined,
  };
}

function numberArg(v: CellIn, what: string, fn: string): number {
  const x = Array.isArray(v) ? (Array.isArray(v[0]) ? v[0][0] : v[0]) : v;
  const n = typeof x === 'number' ? x : typeof x === 'string' && x.trim() !== '' ? Number(x) : NaN;
  if (!Number.isFinite(n)) throw new RemapError(`${fn}: ${what} is "${String(x)}"; give a number.`);
  return n;
}

function finite(v: number): CellOut {
  return Number.isFinite(v) ? v : new CellError('num', `A bound is not a finite number (${v}); give larger samples or fewer extreme values.`);
}
