import { labelCost } from '../engine/cost-label';
import type { GroupedReport } from '../engine/groups/grouped-map';
import { num, warningsInWords } from './plain-words';

/**
 * The list of groups of a map by group, as the pane shows it: one row per
 * group with its rows and effective rows on each side, its cost with the
 * cost's label (exact, lower bound, estimate), whether its own map or the
 * pooled one maps it, and its warnings in words; then the weighted mean cost of
 * all groups and the warnings about the grouping. Pure (no DOM) so it is
 * tested on its own; `groupListTable` draws it as an accessible table.
 */

/** The group list as text: caption, column headers, one row per group, and what follows the table. */
export interface GroupList {
  readonly caption: string;
  readonly header: readonly string[];
  readonly rows: readonly (readonly string[])[];
  /** The cost of all groups in words, then each warning about the grouping (fallbacks used). */
  readonly notes: readonly string[];
}

/** The columns of the pane's group list (design choice: the order of REMAP.GROUPREPORT's, with the cost's label). */
export const GROUP_LIST_HEADER = [
  'Group',
  'Source rows',
  'Target rows',
  'Source effective rows',
  'Target effective rows',
  'Cost',
  'Map used',
  'Warnings',
] as const;

/**
 * The pane's group list of a grouped map's report. Effective rows to 3
 * significant digits (Kish sizes, read by eye); each cost as "value (label)".
 * O(groups + warnings).
 * @example groupList(report).rows[0] // ['North', '40', '50', '40', '50', '12.5 (squared W2, exact)', 'own', 'none']
 */
export function groupList(report: GroupedReport): GroupList {
  const rows = report.groups.map((g) => {
    const cost = labelCost(g.cost);
    const words = warningsInWords(g.warnings);
    return [
      g.group,
      g.rows.source.toLocaleString('en-US'),
      g.rows.target.toLocaleString('en-US'),
      effective(g.effectiveRows.source),
      effective(g.effectiveRows.target),
      `${num(cost.w2Squared)} (${cost.label})`,
      g.pooled ? 'pooled (all rows)' : 'own',
      words.length === 0 ? 'none' : words.map((w) => `${w.title}: ${w.text} What to do: ${w.action}`).join(' '),
    ];
  });
  const n = report.groups.length;
  const caption = `${n} group${n === 1 ? '' : 's'} of this ${report.method} map by group: rows, effective rows (Kish), cost and warnings per group`;
  const notes = [
    `All groups: ${num(report.cost.w2Squared)}. ${report.cost.note}`,
    ...warningsInWords(report.warnings).map((w) => `${w.title}: ${w.text} What to do: ${w.action}`),
  ];
  return { caption, header: [...GROUP_LIST_HEADER], rows, notes };
}

/** Draws a group list as a table with a caption and column and row headers (th scope), for screen readers. */
export function groupListTable(list: GroupList): HTMLTableElement {
  const table = document.createElement('table');
  table.className = 'group-list';
  const caption = document.createElement('caption');
  caption.textContent = list.caption;
  const head = document.createElement('thead');
  const hr = document.createElement('tr');
  for (const h of list.header) {
    const th = document.createElement('th');
    th.scope = 'col';
    th.textContent = h;
    hr.append(th);
  }
  head.append(hr);
  const body = document.createElement('tbody');
  for (const r of list.rows) {
    const tr = document.createElement('tr');
    r.forEach((cell, k) => {
      const td = document.createElement(k === 0 ? 'th' : 'td');
      if (k === 0) (td as HTMLTableCellElement).scope = 'row';
      td.textContent = cell;
      tr.append(td);
    });
    body.append(tr);
  }
  table.append(caption, head, body);
  return table;
}

function effective(n: number): string {
  return Number.isInteger(n) ? n.toLocaleString('en-US') : String(Number(n.toPrecision(3)));
}
