import type { Diagnostics } from '../engine/map';
import { recall } from '../fits';
import type { ComputedFormula } from './run-workbook';

/** What the demo prints for one REMAP.FIT cell. */
export interface FitLine {
  readonly cell: string;
  readonly handle: string;
  readonly diagnostics: Diagnostics | null;
}

/** A formula cell whose result (or part of it) is an error. */
export interface ErrorLine {
  readonly cell: string;
  readonly error: string;
  readonly message: string;
}

export interface WorkbookSummary {
  readonly fits: readonly FitLine[];
  readonly errors: readonly ErrorLine[];
}

const FIT = /^\s*REMAP\.FIT\s*\(/i;

/**
 * Collects, from a calculated workbook's formulas, every REMAP.FIT cell with
 * the diagnostics of its map (from this session's store) and every formula
 * that ended in an error. O(formula cells + spilled cells).
 */
export function summariseFormulas(formulas: readonly ComputedFormula[]): WorkbookSummary {
  const fits: FitLine[] = [];
  const errors: ErrorLine[] = [];
  for (const f of formulas) {
    const cell = `${f.cell.sheet}!${f.cell.address}`;
    let firstError: ErrorLine | null = null;
    for (const row of f.block) {
      for (const v of row) {
        if (v !== null && typeof v === 'object' && firstError === null) firstError = { cell, error: v.error, message: v.message };
      }
    }
    if (firstError) errors.push(firstError);
    if (FIT.test(f.cell.formula)) {
      const v = f.block[0][0];
      const handle = typeof v === 'string' ? v : '';
      const map = handle ? recall(handle) : undefined;
      fits.push({ cell, handle, diagnostics: map ? map.diagnostics() : null });
    }
  }
  return { fits, errors };
}

/** A number in at most 4 significant digits, with thousands separators for large ones. */
export function short(v: number | undefined): string {
  if (v === undefined || !Number.isFinite(v)) return '-';
  const a = Math.abs(v);
  if (a >= 1e4) return Math.round(v).toLocaleString('en-US');
  if (a >= 1) return Number(v.toPrecision(4)).toString();
  if (a === 0) return '0';
  return Number(v.toPrecision(3)).toString();
}

/**
 * The summary as text lines: one block per fit (method, rows, cost, energy
 * distance before -> after, largest KS after, convergence, warnings), then the
 * formulas that gave errors with their messages. O(fits + errors).
 */
export function formatSummary(s: WorkbookSummary): string[] {
  const lines: string[] = [];
  for (const f of s.fits) {
    const d = f.diagnostics;
    if (!d) {
      lines.push(`  ${f.cell}: no map (see the error below)`);
      continue;
    }
    const conv = d.convergence
      ? `, ${d.convergence.converged ? 'converged' : 'not converged'} after ${d.convergence.iterations} ${d.method === 'gradient-net' ? 'steps' : 'iterations'}`
      : '';
    lines.push(`  ${f.cell}  ${d.method}, ${d.n.source} -> ${d.n.target} rows x ${d.d} column${d.d === 1 ? '' : 's'}${conv}`);
    lines.push(
      `      cost (squared W2) ${short(d.cost.w2Squared)}   energy distance ${short(d.energyBefore)} -> ${short(d.energyAfter)}   largest KS ` +
        `after ${short(d.ksMaxAfter)}` +
        (d.minJacobianEigenvalue !== undefined ? `   smallest Jacobian eigenvalue ${short(d.minJacobianEigenvalue)}` : ''),
    );
    lines.push(`      warnings: ${d.warnings.length === 0 ? 'none' : d.warnings.map((w) => w.code).join(', ')}`);
  }
  for (const e of s.errors) lines.push(`  ${e.cell}: ${e.error} ${e.message}`);
  return lines;
}
