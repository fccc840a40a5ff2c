import type { GroupedReport } from '../engine/groups/grouped-map';
import { $, listItem } from './dom';
import { groupList, groupListTable } from './group-list';
import { pane } from './pane-state';
import { warningsInWords } from './plain-words';

/*
 * A map by group in "What the fit says": a short summary, the warnings about
 * the grouping, and the table of groups (sizes, effective sizes, cost with its
 * label, warnings per group). Plots are drawn for single maps fitted from the
 * pane only, so they are hidden here.
 */

/** Shows a map by group's report in the results section. */
export function showGroupedResults(handle: string, report: GroupedReport, cell?: string): void {
  $('results').hidden = false;
  $('result-handle').textContent = handle;
  const list = groupList(report);
  $('diagnostics').replaceChildren(
    listItem(
      `Map by group: ${report.method}, ${report.groups.length} groups, ${report.d} column${report.d === 1 ? '' : 's'}${cell ? `, made by ${cell}` : ''}.`,
    ),
    ...list.notes.slice(0, 1).map((t) => listItem(t)),
  );
  const warnings = warningsInWords(report.warnings);
  $('warnings').replaceChildren(
    ...(warnings.length === 0
      ? [listItem('No warnings about the grouping; each group\u2019s own warnings are in the table below.', 'none')]
      : warnings.map((w) => listItem(`${w.title}: ${w.text} What to do: ${w.action}`))),
  );
  pane.shown = null;
  $('plots-box').hidden = true;
  $('groups-table').replaceChildren(groupListTable(list));
  $('groups-box').hidden = false;
}

/** Hides the table of groups (a single map is shown). */
export function hideGroups(): void {
  $('groups-box').hidden = true;
  $('groups-table').replaceChildren();
}
