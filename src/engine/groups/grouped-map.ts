import { RemapError } from '../errors';
import type { CostReport, MapJSON, Mapped, MethodName, TransportMap, Warning } from '../map';
import type { Points } from '../points';
import type { Settings } from '../settings';
import { groupRows, type GroupLabel } from './group-labels';
import { pickPointRows } from './pick-rows';

/** What to do with a group that lacks rows: refuse (default) or map it with the map fitted on all rows. */
export type GroupFallback = 'none' | 'pooled';

/** Row counts, Kish effective rows and total weight of one group on each side. */
export interface GroupSizes {
  readonly rows: { readonly source: number; readonly target: number };
  readonly effectiveRows: { readonly source: number; readonly target: number };
  readonly weight: { readonly source: number; readonly target: number };
}

/** One group of a grouped map: its own fitted map, or the pooled one with the reason. */
export interface GroupEntry extends GroupSizes {
  readonly group: string;
  /** The group's own map; null when the pooled map stands in. */
  readonly map: TransportMap | null;
  /** Why the pooled map stands in; null for a group with its own map. */
  readonly reason: string | null;
}

/** One line of the grouped report. */
export interface GroupReport extends GroupSizes {
  readonly group: string;
  readonly pooled: boolean;
  readonly cost: CostReport;
  readonly warnings: readonly Warning[];
}

/** Everything a user may want to know about a grouped map, group by group. */
export interface GroupedReport {
  readonly method: MethodName;
  readonly d: number;
  readonly columns: readonly string[] | null;
  readonly settings: Settings;
  readonly fallback: GroupFallback;
  readonly groups: readonly GroupReport[];
  /** Source-weighted mean of the groups' squared W2 (groups with no source rows count for nothing). */
  readonly cost: { readonly w2Squared: number; readonly w2: number; readonly note: string };
  /** Rows mapped so far, rows outside their group's fitted range, and rows of groups the map did not know (mapped by the pooled map). */
  readonly applied: { readonly rows: number; readonly outside: number; readonly pooledRows: number };
  /** Warnings about the grouping itself (fallbacks used); each group's own warnings are in `groups`. */
  readonly warnings: readonly Warning[];
}

/** The serialised form of a grouped map (`remap fit-groups --out`, the workbook store). */
export interface GroupedMapJSON {
  readonly format: 'remap.grouped-map';
  readonly version: 1;
  readonly method: MethodName;
  readonly d: number;
  readonly columns: readonly string[] | null;
  readonly settings: Settings;
  readonly fallback: GroupFallback;
  readonly groups: readonly (GroupSizes & { readonly group: string; readonly map: MapJSON | null; readonly reason: string | null })[];
  /** The map fitted on all rows, present when fallback is 'pooled'. */
  readonly pooled: MapJSON | null;
}

/**
 * One transport map per group, fitted with one method and one set of
 * settings: values are mapped by the map of their own group. Groups that
 * lacked rows at fit time, and (when the fallback is 'pooled') groups the map
 * has never seen, are mapped by the pooled map fitted on all rows, and the
 * report says so group by group. Built by `fitGroupedMap` or
 * `restoreGroupedMap`; both give bit-identical results.
 * @example (await fitGroupedMap('quantile', s, sGroups, t, tGroups)).apply(column([3]), ['North']) // North's map at 3
 */
export class GroupedMap {
  readonly method: MethodName;
  readonly d: number;
  readonly columns: readonly string[] | null;
  readonly settings: Settings;
  readonly fallback: GroupFallback;
  readonly entries: readonly GroupEntry[];
  readonly pooled: TransportMap | null;
  private readonly byKey: ReadonlyMap<string, GroupEntry>;
  private appliedRows = 0;
  private appliedOutside = 0;
  private readonly unseen = new Map<string, number>();

  constructor(
    method: MethodName,
    d: number,
    columns: readonly string[] | null,
    settings: Settings,
    fallback: GroupFallback,
    entries: readonly GroupEntry[],
    pooled: TransportMap | null,
  ) {
    this.method = method;
    this.d = d;
    this.columns = columns;
    this.settings = settings;
    this.fallback = fallback;
    this.entries = entries;
    this.pooled = pooled;
    this.byKey = new Map(entries.map((e) => [e.group, e]));
  }

  /** The group keys, in the order they were first seen (source, then target, then the groups asked for). */
  groups(): string[] {
    return this.entries.map((e) => e.group);
  }

  /**
   * The map that maps values of `group`: its own, or the pooled one.
   * @throws RemapError for a group the map does not know when there is no pooled map.
   */
  mapOf(group: GroupLabel, fn = 'grouped map'): TransportMap {
    const key = typeof group === 'number' ? String(group) : String(group).trim();
    const e = this.byKey.get(key);
    if (e && e.map) return e.map;
    if (this.pooled) return this.pooled;
    const known = this.groups();
    throw new RemapError(
      `${fn}: group "${key}" is not one the map was fitted on (its groups: ${known
        .slice(0, 12)
        .map((g) => `"${g}"`)
        .join(', ')}${known.length > 12 ? ', ...' : ''}); give values of those groups, or fit again with the pooled fallback.`,
    );
  }

  /** T_g(x) for each row x of group g. O(n) to split plus each group's apply. Never mutates x. */
  apply(x: Points, groups: ArrayLike<GroupLabel>): Mapped {
    return this.run(x, groups, 'apply');
  }

  /** T_g^-1(y) for each row y of group g. Throws where a group's method has no inverse. */
  invert(y: Points, groups: ArrayLike<GroupLabel>): Mapped {
    return this.run(y, groups, 'invert');
  }

  private run(x: Points, labels: ArrayLike<GroupLabel>, verb: 'apply' | 'invert'): Mapped {
    const fn = `${verb} by group`;
    if (x.d !== this.d)
      throw new RemapError(
        `${fn}: the values have ${x.d} column${x.d === 1 ? '' : 's'} but the map was fitted on ${this.d}; give values with ${this.d} column${this.d === 1 ? '' : 's'}.`,
      );
    const split = groupRows(labels, x.n, 'group labels of the values', fn);
    const out = new Float64Array(x.n * x.d);
    let outside = 0;
    for (const key of split.keys) {
      const rows = split.rows.get(key)!;
      const map = this.mapOf(key, fn);
      const r = verb === 'apply' ? map.apply(pickPointRows(x, rows)) : map.invert(pickPointRows(x, rows));
      for (let i = 0; i < rows.length; i++) for (let k = 0; k < x.d; k++) out[rows[i] * x.d + k] = r.data[i * x.d + k];
      outside += r.outside;
      if (!this.byKey.has(key)) this.unseen.set(key, (this.unseen.get(key) ?? 0) + rows.length);
    }
    this.appliedRows += x.n;
    this.appliedOutside += outside;
    return { n: x.n, d: x.d, data: out, outside };
  }

  /** Every group with its sizes, cost and warnings, and the warnings about fallbacks. O(groups) plus each map's diagnostics. */
  report(): GroupedReport {
    const groups: GroupReport[] = [];
    const warnings: Warning[] = [];
    let num = 0;
    let den = 0;
    for (const e of this.entries) {
      const map = e.map ?? this.pooled!;
      const diag = map.diagnostics();
      groups.push({
        group: e.group,
        rows: e.rows,
        effectiveRows: e.effectiveRows,
        weight: e.weight,
        pooled: e.map === null,
        cost: diag.cost,
        warnings: diag.warnings,
      });
      num += e.weight.source * diag.cost.w2Squared;
      den += e.weight.source;
    }
    const pooledGroups = this.entries.filter((e) => e.map === null);
    if (pooledGroups.length > 0) {
      warnings.push({
        code: 'small-sample',
        message: `The map fitted on all rows stands in for ${pooledGroups.length} group${pooledGroups.length === 1 ? '' : 's'}: ${pooledGroups.map((e) => `"${e.group}" (${e.reason})`).join('; ')}. Values of those groups are mapped as if they came from the whole population, not their own group.`,
        action: "Treat those groups' results as rough; add rows to them, merge them with a similar group, or leave them out.",
      });
    }
    let pooledRows = 0;
    if (this.unseen.size > 0) {
      for (const v of this.unseen.values()) pooledRows += v;
      warnings.push({
        code: 'small-sample',
        message: `Values of ${this.unseen.size} group${this.unseen.size === 1 ? '' : 's'} the map was not fitted on were mapped by the map fitted on all rows: ${[...this.unseen].map(([g, n]) => `"${g}" (${n} row${n === 1 ? '' : 's'})`).join('; ')}.`,
        action: 'Check the group labels of the values; fit again including those groups if they should have their own map.',
      });
    }
    const w2Squared = den > 0 ? num / den : 0;
    return {
      method: this.method,
      d: this.d,
      columns: this.columns,
      settings: this.settings,
      fallback: this.fallback,
      groups,
      cost: {
        w2Squared,
        w2: Math.sqrt(w2Squared),
        note: "Mean of the groups' squared 2-Wasserstein costs weighted by each group's share of the source weight: the cost of moving every group onto its own target group.",
      },
      applied: { rows: this.appliedRows, outside: this.appliedOutside, pooledRows },
      warnings,
    };
  }

  /** All groups' maps and the pooled map as one JSON object. O(total parameters). */
  toJSON(): GroupedMapJSON {
    return {
      format: 'remap.grouped-map',
      version: 1,
      method: this.method,
      d: this.d,
      columns: this.columns,
      settings: this.settings,
      fallback: this.fallback,
      groups: this.entries.map((e) => ({
        group: e.group,
        rows: e.rows,
        effectiveRows: e.effectiveRows,
        weight: e.weight,
        map: e.map ? e.map.toJSON() : null,
        reason: e.reason,
      })),
      pooled: this.pooled ? this.pooled.toJSON() : null,
    };
  }

  /** Frees every group's map (tensors of gradient-net maps). */
  dispose(): void {
    for (const e of this.entries) e.map?.dispose();
    this.pooled?.dispose();
  }
}
