import type { GroupedReport } from '../engine/groups/grouped-map';
import type { Warning } from '../engine/map';

/**
 * Every warning of a map by group in one list, for a door that shows a formula's warnings (the pane's list of
 * formulas): first those about the grouping itself (groups the pooled map stood in for), then each group's own,
 * its message led by the group's name so that a reader knows which group it concerns. O(#warnings).
 * @example groupedWarnings(map.report())[0].message // 'Group "North": The source has 12 usable rows, ...'
 */
export function groupedWarnings(report: GroupedReport): Warning[] {
  const out: Warning[] = [...report.warnings];
  for (const g of report.groups) for (const w of g.warnings) out.push({ ...w, message: `Group "${g.group}": ${w.message}` });
  return out;
}
