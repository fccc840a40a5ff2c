import type { GroupedReport } from '../engine/groups/grouped-map';
import type { Grid } from '../input';

/** The columns of a group table, in order. */
export const GROUP_TABLE_HEADER = [
  'group',
  'source rows',
  'target rows',
  'source effective rows',
  'target effective rows',
  'squared W2',
  'map used',
  'warnings',
] as const;

/**
 * A grouped map's report as cells: a header row, one row per group (its rows,
 * Kish effective rows, exact or estimated cost, whether the pooled map stood
 * in, its warnings' codes), then a row for all groups (the weighted mean cost)
 * and a row per warning about fallbacks. REMAP.GROUPREPORT and the pane use it.
 * Effective rows are rounded to one decimal (they are a size, read by eye). O(groups).
 */
export function groupTable(report: GroupedReport): Grid {
  const out: Grid = [[...GROUP_TABLE_HEADER]];
  for (const g of report.groups) {
    out.push([
      g.group,
      g.rows.source,
      g.rows.target,
      Math.round(g.effectiveRows.source * 10) / 10,
      Math.round(g.effectiveRows.target * 10) / 10,
      g.cost.w2Squared,
      g.pooled ? 'pooled (all rows)' : 'own',
      g.warnings.length === 0 ? 'none' : g.warnings.map((w) => w.code).join(', '),
    ]);
  }
  out.push(['all groups', sum(report.groups, 'source'), sum(report.groups, 'target'), '', '', report.cost.w2Squared, report.method, report.cost.note]);
  for (const w of report.warnings) out.push(['warning', '', '', '', '', '', '', `${w.message} ${w.action}`]);
  return out;
}

function sum(groups: GroupedReport['groups'], side: 'source' | 'target'): number {
  let s = 0;
  for (const g of groups) s += g.rows[side];
  return s;
}
