import {
  ArraySize,
  CellError as HfCellError,
  ErrorType,
  FunctionArgumentType,
  FunctionPlugin,
  HyperFormula,
  type FunctionArgument,
  type ImplementedFunctions,
} from 'hyperformula';
import * as calls from '../functions/calls';
import { bounds } from '../functions/bounds-call';
import * as groupCalls from '../functions/group-calls';
import { toTable } from '../functions/table-call';
import type { CellIn } from '../input/cells';
import { guard, setErrorFactory } from '../functions/excel-errors';
import { argFromHf, cellToHf, gridToHf, hfErrorFactory } from './hf-values';
import { cellKey, currentRun } from './run-context';

/**
 * The REMAP worksheet functions as a HyperFormula function plugin, so a
 * workbook can be calculated without Excel. Every function calls the very
 * same implementation the add-in runs (src/functions/calls.ts) through the
 * same error guard (src/functions/excel-errors.ts); only the translation of
 * values differs:
 *  - in: HyperFormula ranges become lists of rows, EmptyValue becomes a blank,
 *    HyperFormula errors become error cells (skipped by the coercion rules);
 *  - out: our errors become HyperFormula CellErrors of the same type (#VALUE!,
 *    #NUM!, #N/A) with the same message (setErrorFactory); result grids spill;
 *  - spills: HyperFormula fixes a result's size before evaluating, from the
 *    formula alone. REMAP.VALUES, APPLY and INVERT spill in the shape of their
 *    values range, PAIRS one row per source row, REPORT a block of
 *    REPORT_ROWS x 2 (unused rows stay blank);
 *  - background fits (gradient-net): a fit that returns a Promise is recorded in
 *    the current run (run-context.ts) and the cell shows #N/A until the run has
 *    awaited it and recalculated; then the map is in the store and the
 *    synchronous evaluation finds it.
 */

/** Rows reserved for a REMAP.REPORT table (two columns: label, value). */
export const REPORT_ROWS = 40;

/** Rows reserved for a REMAP.GROUPREPORT table (a header, the groups, all groups, warnings; design choice: 30 groups at most show). */
export const GROUP_REPORT_ROWS = 34;

const any = (optional = false): FunctionArgument => ({ argumentType: FunctionArgumentType.ANY, ...(optional ? { optionalArg: true } : {}) });
const params = (required: number, optional: number): FunctionArgument[] => [
  ...Array.from({ length: required }, () => any()),
  ...Array.from({ length: optional }, () => any(true)),
];

type Impl = (...args: CellIn[]) => unknown;
/** How big a result is: [rows, cols], computed from the formula's arguments before evaluation. */
type SizeOf = (sizes: (ArraySize | undefined)[], literals: (unknown | undefined)[]) => [number, number];

interface Spec {
  readonly method: string;
  readonly sizeMethod?: string;
  readonly parameters: FunctionArgument[];
  readonly impl: Impl;
  readonly size?: SizeOf;
}

const shapeOf =
  (k: number): SizeOf =>
  (sizes) => {
    const s = sizes[k];
    return s ? [Math.max(1, s.height), Math.max(1, s.width)] : [1, 1];
  };

/** REMAP.BOUNDS: a row per values row, three columns (mapped, lower, upper) per values column. */
const boundsSize: SizeOf = (sizes) => {
  const s = sizes[0];
  return s ? [Math.max(1, s.height), 3 * Math.max(1, s.width)] : [1, 3];
};

const pairsSize: SizeOf = (sizes, literals) => {
  const s = sizes[0];
  if (!s) return [1, 1];
  const sideways = s.height === 1 && s.width > 1;
  const rows = sideways ? s.width : Math.max(1, s.height);
  const d = sideways ? 1 : Math.max(1, s.width);
  const out = literals[2];
  return [rows, typeof out === 'string' && out.trim().toLowerCase() === 'index' ? 1 : d];
};

/** The REMAP functions: name -> implementation, parameters and result size. */
export const REMAP_FUNCTIONS: Readonly<Record<string, Spec>> = {
  'REMAP.VALUES': { method: 'values', sizeMethod: 'valuesSize', parameters: params(3, 4), impl: calls.values as Impl, size: shapeOf(0) },
  'REMAP.COST': { method: 'cost', parameters: params(2, 4), impl: calls.cost as Impl },
  'REMAP.GAUSSCOST': { method: 'gausscost', parameters: params(4, 0), impl: calls.gaussCost as Impl },
  'REMAP.FIT': { method: 'fit', parameters: params(2, 4), impl: ((...a: CellIn[]) => calls.fit(a[0], a[1], a[2], a[3], a[4], a[5])) as Impl },
  'REMAP.APPLY': { method: 'apply', sizeMethod: 'applySize', parameters: params(2, 0), impl: calls.apply as Impl, size: shapeOf(1) },
  'REMAP.INVERT': { method: 'invert', sizeMethod: 'invertSize', parameters: params(2, 0), impl: calls.invert as Impl, size: shapeOf(1) },
  'REMAP.REPORT': { method: 'report', sizeMethod: 'reportSize', parameters: params(1, 0), impl: calls.report as Impl, size: () => [REPORT_ROWS, 2] },
  'REMAP.SAVE': { method: 'save', parameters: params(1, 0), impl: calls.save as Impl },
  'REMAP.PAIRS': { method: 'pairs', sizeMethod: 'pairsSize', parameters: params(2, 1), impl: calls.pairs as Impl, size: pairsSize },
  'REMAP.LOAD': { method: 'load', parameters: params(1, 0), impl: calls.load as Impl },
  'REMAP.BOUNDS': { method: 'bounds', sizeMethod: 'boundsSize', parameters: params(3, 8), impl: bounds as Impl, size: boundsSize },
  'REMAP.BYGROUP': { method: 'bygroup', sizeMethod: 'bygroupSize', parameters: params(6, 5), impl: groupCalls.byGroup as Impl, size: shapeOf(0) },
  'REMAP.FITGROUPS': { method: 'fitgroups', parameters: params(4, 5), impl: groupCalls.fitGroups as Impl },
  'REMAP.APPLYGROUPS': {
    method: 'applygroups',
    sizeMethod: 'applygroupsSize',
    parameters: params(3, 1),
    impl: groupCalls.applyGroups as Impl,
    size: shapeOf(1),
  },
  'REMAP.GROUPREPORT': {
    method: 'groupreport',
    sizeMethod: 'groupreportSize',
    parameters: params(1, 0),
    impl: groupCalls.groupReport as Impl,
    size: () => [GROUP_REPORT_ROWS, 8],
  },
  'REMAP.TOTABLE': { method: 'totable', sizeMethod: 'totableSize', parameters: params(3, 6), impl: toTable as Impl, size: shapeOf(0) },
};

type ProcedureAst = Parameters<FunctionPlugin['runFunction']>[0] extends (infer A)[] ? { args: A[]; procedureName: string } : never;
type State = Parameters<FunctionPlugin['runFunction']>[1];

/** The plugin class HyperFormula instantiates per engine. */
export class RemapPlugin extends FunctionPlugin {
  static override implementedFunctions: ImplementedFunctions = Object.fromEntries(
    Object.entries(REMAP_FUNCTIONS).map(([name, s]) => [
      name,
      { method: s.method, parameters: s.parameters, vectorizationForbidden: true, ...(s.sizeMethod ? { sizeOfResultArrayMethod: s.sizeMethod } : {}) },
    ]),
  );

  values(ast: ProcedureAst, state: State) {
    return this.call('REMAP.VALUES', ast, state);
  }
  cost(ast: ProcedureAst, state: State) {
    return this.call('REMAP.COST', ast, state);
  }
  gausscost(ast: ProcedureAst, state: State) {
    return this.call('REMAP.GAUSSCOST', ast, state);
  }
  fit(ast: ProcedureAst, state: State) {
    return this.call('REMAP.FIT', ast, state);
  }
  apply(ast: ProcedureAst, state: State) {
    return this.call('REMAP.APPLY', ast, state);
  }
  invert(ast: ProcedureAst, state: State) {
    return this.call('REMAP.INVERT', ast, state);
  }
  report(ast: ProcedureAst, state: State) {
    return this.call('REMAP.REPORT', ast, state);
  }
  save(ast: ProcedureAst, state: State) {
    return this.call('REMAP.SAVE', ast, state);
  }
  pairs(ast: ProcedureAst, state: State) {
    return this.call('REMAP.PAIRS', ast, state);
  }
  load(ast: ProcedureAst, state: State) {
    return this.call('REMAP.LOAD', ast, state);
  }
  bounds(ast: ProcedureAst, state: State) {
    return this.call('REMAP.BOUNDS', ast, state);
  }
  bygroup(ast: ProcedureAst, state: State) {
    return this.call('REMAP.BYGROUP', ast, state);
  }
  fitgroups(ast: ProcedureAst, state: State) {
    return this.call('REMAP.FITGROUPS', ast, state);
  }
  applygroups(ast: ProcedureAst, state: State) {
    return this.call('REMAP.APPLYGROUPS', ast, state);
  }
  groupreport(ast: ProcedureAst, state: State) {
    return this.call('REMAP.GROUPREPORT', ast, state);
  }
  totable(ast: ProcedureAst, state: State) {
    return this.call('REMAP.TOTABLE', ast, state);
  }

  valuesSize(ast: ProcedureAst, state: State) {
    return this.sizeFor('REMAP.VALUES', ast, state);
  }
  applySize(ast: ProcedureAst, state: State) {
    return this.sizeFor('REMAP.APPLY', ast, state);
  }
  invertSize(ast: ProcedureAst, state: State) {
    return this.sizeFor('REMAP.INVERT', ast, state);
  }
  reportSize(ast: ProcedureAst, state: State) {
    return this.sizeFor('REMAP.REPORT', ast, state);
  }
  pairsSize(ast: ProcedureAst, state: State) {
    return this.sizeFor('REMAP.PAIRS', ast, state);
  }
  boundsSize(ast: ProcedureAst, state: State) {
    return this.sizeFor('REMAP.BOUNDS', ast, state);
  }
  bygroupSize(ast: ProcedureAst, state: State) {
    return this.sizeFor('REMAP.BYGROUP', ast, state);
  }
  applygroupsSize(ast: ProcedureAst, state: State) {
    return this.sizeFor('REMAP.APPLYGROUPS', ast, state);
  }
  groupreportSize(ast: ProcedureAst, state: State) {
    return this.sizeFor('REMAP.GROUPREPORT', ast, state);
  }
  totableSize(ast: ProcedureAst, state: State) {
    return this.sizeFor('REMAP.TOTABLE', ast, state);
  }

  /** [rows, cols] of the result of `name` written as `ast`, from argument sizes and literal arguments only. */
  private resultSize(name: string, ast: ProcedureAst, state: State): [number, number] {
    const spec = REMAP_FUNCTIONS[name];
    if (!spec.size) return [1, 1];
    const args = ast.args as unknown as { type?: string; value?: unknown }[];
    const sizes = args.map((a) => (a && (a as { type?: string }).type !== 'EMPTY' ? this.arraySizeForAst(a as never, state) : undefined));
    const literals = args.map((a) => (a && a.type === 'STRING' ? a.value : undefined));
    const [r, c] = spec.size(sizes, literals);
    return [Math.max(1, Math.min(r, 1_048_576)), Math.max(1, Math.min(c, 16_384))];
  }

  private sizeFor(name: string, ast: ProcedureAst, state: State): ArraySize {
    const [rows, cols] = this.resultSize(name, ast, state);
    currentRun()?.spills.set(cellKey(state.formulaAddress), { rows, cols });
    return new ArraySize(cols, rows);
  }

  private call(name: string, ast: ProcedureAst, state: State) {
    const spec = REMAP_FUNCTIONS[name];
    const [rows, cols] = this.resultSize(name, ast, state);
    const body = (...raw: unknown[]): unknown => {
      const run = currentRun();
      const key = cellKey(state.formulaAddress);
      const failed = run?.failures.get(key);
      if (failed !== undefined) return failed;
      let r: unknown;
      try {
        r = guard(() => spec.impl(...raw.map(argFromHf)) as never);
      } catch (e) {
        return e instanceof HfCellError ? e : hfErrorFactory('value', `${name}: ${e instanceof Error ? e.message : String(e)}`);
      }
      if (r instanceof Promise) {
        const settled = r.then(
          () => undefined,
          (e: unknown) => {
            run?.failures.set(key, e instanceof HfCellError ? e : hfErrorFactory('value', String(e)));
          },
        );
        run?.pending.set(key, settled);
        return new HfCellError(
          ErrorType.NA,
          run
            ? `${name}: the map is still being fitted in the background; the run recalculates when it is ready.`
            : `${name}: this method trains in the background; calculate the workbook with runWorkbook, which waits for it.`,
        );
      }
      if (Array.isArray(r)) {
        if (rows === 1 && cols === 1) return cellToHf((r as unknown[][])[0]?.[0] ?? '');
        return gridToHf(r as unknown[][], rows, cols);
      }
      return cellToHf(r);
    };
    return this.runFunction(ast.args as never, state, this.metadata(name), body as never) as never;
  }
}

/** Function names as formulas spell them, in every HyperFormula language we use. */
const TRANSLATIONS = { enGB: Object.fromEntries(Object.keys(REMAP_FUNCTIONS).map((k) => [k, k])) };

let registered = false;

/**
 * Registers the REMAP functions with HyperFormula (once per process) and makes
 * the worksheet functions' errors HyperFormula errors. Call before building an
 * engine. O(1).
 * @example registerRemapPlugin(); HyperFormula.buildFromArray([['=REMAP.GAUSSCOST(0, 1, 0, 4)']], { licenseKey: 'gpl-v3' })
 */
export function registerRemapPlugin(): void {
  setErrorFactory(hfErrorFactory);
  if (registered) return;
  HyperFormula.registerFunctionPlugin(RemapPlugin, TRANSLATIONS);
  registered = true;
}
