/* Builds the demo workbooks in demo-workbooks/ from the invented data in
 * demo-workbooks/data/ (itself made by scripts/make-demo-data.ts from fixed seeds).
 * Run: npx tsx scripts/make-demo-workbooks.ts   (the output is committed; rerunning gives the same workbooks)
 *
 * Each workbook holds REMAP.* formulas exactly as a user would type them, with
 * no cached results: Excel with the add-in, or `npm run demo` (scripts/demo.ts,
 * which calculates them headless), fills them in. Each has an "About" sheet
 * saying in plain words what it shows and which formulas to look at. Spilled
 * results are stored as array formulas over the block they fill. */
import * as fs from 'fs';
import * as path from 'path';
import { Workbook, type Worksheet } from 'exceljs';
import { parseCSV, csvCell } from '../src/cli/csv';
import { REPORT_ROWS } from '../src/headless/remap-plugin';
import type { PlotSpec } from '../src/headless/plot-spec';
import { a1, parseA1 } from '../src/headless/workbook-io';

export const DEMO_DIR = path.join(__dirname, '..', 'demo-workbooks');
const DATA_DIR = path.join(DEMO_DIR, 'data');

export interface DemoWorkbook {
  readonly file: string;
  readonly title: string;
  readonly build: () => Workbook;
  readonly plots: readonly PlotSpec[];
  /** Ranges every fitted map of the workbook is compared on (the same rows for all), when the maps should be put side by side. */
  readonly compareOn?: { readonly source: string; readonly target: string };
}

/** The gradient-net settings the demo uses: modest, so the whole demo stays near a minute on 2 cores. */
export const DEMO_GRADIENT_NET_SETTINGS = 'seed=7; steps=150';
/** Rows of each scenario set the entropic demo fit uses (its kernel grows with rows squared). */
export const DEMO_ENTROPIC_ROWS = 1500;

function readData(name: string): (string | number | null)[][] {
  return parseCSV(fs.readFileSync(path.join(DATA_DIR, name), 'utf8'), name).map((row) => row.map((f) => csvCell(f)));
}

function dataSheet(wb: Workbook, name: string, rows: (string | number | null)[][], widths: number[]): Worksheet {
  const ws = wb.addWorksheet(name);
  for (const r of rows) ws.addRow(r);
  ws.getRow(1).font = { bold: true };
  ws.views = [{ state: 'frozen', ySplit: 1 }];
  widths.forEach((w, i) => (ws.getColumn(i + 1).width = w));
  return ws;
}

/** Puts a formula at `addr`; a result of more than one cell is stored as an array formula over its block. */
function formula(ws: Worksheet, addr: string, text: string, rows = 1, cols = 1): void {
  const { r0, c0 } = parseA1(addr);
  const value: Record<string, unknown> = { formula: text };
  if (rows * cols > 1) {
    value.shareType = 'array';
    value.ref = `${a1(r0, c0)}:${a1(r0 + rows - 1, c0 + cols - 1)}`;
  }
  ws.getCell(addr).value = value as never;
}

function label(ws: Worksheet, addr: string, text: string, bold = true): void {
  const c = ws.getCell(addr);
  c.value = text;
  if (bold) c.font = { bold: true };
}

function about(wb: Workbook, title: string, paragraphs: string[]): void {
  const ws = wb.addWorksheet('About');
  ws.getColumn(1).width = 110;
  const t = ws.getCell('A1');
  t.value = title;
  t.font = { bold: true, size: 14 };
  paragraphs.forEach((p, i) => {
    const c = ws.getCell(`A${i + 3}`);
    c.value = p;
    c.alignment = { wrapText: true, vertical: 'top' };
    if (p.startsWith('=') || p.startsWith('  =')) c.value = `  ${p.trim()}`;
  });
}

function newWorkbook(): Workbook {
  const wb = new Workbook();
  wb.creator = 'Remap demo (scripts/make-demo-workbooks.ts)';
  // fixed dates so rerunning gives the same workbook
  wb.created = new Date(Date.UTC(2025, 0, 1));
  wb.modified = new Date(Date.UTC(2025, 0, 1));
  return wb;
}

/** 1. Two survey waves, wave 2 put on wave 1's scale. */
function surveyWaves(): Workbook {
  const w1 = readData('survey-wave1.csv');
  const w2 = readData('survey-wave2.csv');
  const n1 = w1.length - 1;
  const n2 = w2.length - 1;
  const e1 = n1 + 1;
  const e2 = n2 + 1;
  const wb = newWorkbook();
  about(wb, 'Harbourside Living Conditions Survey (two independent waves): putting wave 2 on wave 1\'s scale (invented data)', [
    'The Harbourside Living Conditions Survey is an invented survey; each wave is an independent sample of households (a repeated cross-section, not a panel). Wave 2 used a new questionnaire: income was asked net of a levy, so it came out lower and more compressed, and the 0-10 satisfaction question got friendlier wording, so scores drifted up. The households are different people in each wave, so there are no pairs to match: only the two distributions.',
    'Sheet Wave2, column F, holds each wave-2 income on wave 1\'s scale: the continuous quantile map, with both waves\' survey weights honoured. A household at wave 2\'s weighted 30th percentile gets wave 1\'s weighted 30th-percentile income:',
    `=REMAP.VALUES(B2:B${e2}, B2:B${e2}, Wave1!B2:B${e1}, "quantile", , D2:D${e2}, Wave1!D2:D${e1})`,
    'Column G does the same for the satisfaction score with the ordinal method (equipercentile equating of whole-number scores, Kolen & Brennan), again with the weights:',
    `=REMAP.VALUES(C2:C${e2}, C2:C${e2}, Wave1!C2:C${e1}, "ordinal", , D2:D${e2}, Wave1!D2:D${e1})`,
    'Sheet Check compares weighted means and medians before and after, gives REMAP.COST (how far wave 2 had to move, as a squared 2-Wasserstein distance), and fits the same two maps with REMAP.FIT so that REMAP.REPORT can list their diagnostics: rows used, cost, how close the mapped wave 2 came to wave 1 (energy distance, KS) and any warnings.',
    'Things to try: change a weight in Wave2!D and watch the harmonised incomes move; replace "quantile" with "step" to get only values that occur in wave 1.',
  ]);
  dataSheet(wb, 'Wave1', w1, [12, 12, 13, 10]);
  const ws2 = dataSheet(wb, 'Wave2', w2, [12, 12, 13, 10, 3, 22, 22]);
  label(ws2, 'F1', 'income on wave 1 scale');
  label(ws2, 'G1', 'satisfaction on wave 1 scale');
  formula(ws2, 'F2', `REMAP.VALUES(B2:B${e2}, B2:B${e2}, Wave1!B2:B${e1}, "quantile", , D2:D${e2}, Wave1!D2:D${e1})`, n2, 1);
  formula(ws2, 'G2', `REMAP.VALUES(C2:C${e2}, C2:C${e2}, Wave1!C2:C${e1}, "ordinal", , D2:D${e2}, Wave1!D2:D${e1})`, n2, 1);
  ws2.getColumn(6).numFmt = '#,##0';
  ws2.getColumn(7).numFmt = '0.00';

  const ck = wb.addWorksheet('Check');
  ck.getColumn(1).width = 44;
  [16, 16, 16].forEach((w, i) => (ck.getColumn(i + 2).width = w));
  label(ck, 'B1', 'wave 1');
  label(ck, 'C1', 'wave 2 as asked');
  label(ck, 'D1', 'wave 2 harmonised');
  const wmean = (v: string, w: string) => `SUMPRODUCT(${v}, ${w})/SUM(${w})`;
  label(ck, 'A2', 'weighted mean income', false);
  formula(ck, 'B2', wmean(`Wave1!B2:B${e1}`, `Wave1!D2:D${e1}`));
  formula(ck, 'C2', wmean(`Wave2!B2:B${e2}`, `Wave2!D2:D${e2}`));
  formula(ck, 'D2', wmean(`Wave2!F2:F${e2}`, `Wave2!D2:D${e2}`));
  label(ck, 'A3', 'median income (unweighted)', false);
  formula(ck, 'B3', `MEDIAN(Wave1!B2:B${e1})`);
  formula(ck, 'C3', `MEDIAN(Wave2!B2:B${e2})`);
  formula(ck, 'D3', `MEDIAN(Wave2!F2:F${e2})`);
  label(ck, 'A4', 'weighted mean satisfaction', false);
  formula(ck, 'B4', wmean(`Wave1!C2:C${e1}`, `Wave1!D2:D${e1}`));
  formula(ck, 'C4', wmean(`Wave2!C2:C${e2}`, `Wave2!D2:D${e2}`));
  formula(ck, 'D4', wmean(`Wave2!G2:G${e2}`, `Wave2!D2:D${e2}`));
  [2, 3].forEach((r) => ['B', 'C', 'D'].forEach((c) => (ck.getCell(`${c}${r}`).numFmt = '#,##0')));
  ['B', 'C', 'D'].forEach((c) => (ck.getCell(`${c}4`).numFmt = '0.00'));

  label(ck, 'A6', 'cost of moving wave 2 income onto wave 1 (squared W2)', false);
  formula(ck, 'B6', `REMAP.COST(Wave2!B2:B${e2}, Wave1!B2:B${e1}, "quantile", , Wave2!D2:D${e2}, Wave1!D2:D${e1})`);
  label(ck, 'A7', 'cost of moving wave 2 satisfaction (squared W2)', false);
  formula(ck, 'B7', `REMAP.COST(Wave2!C2:C${e2}, Wave1!C2:C${e1}, "ordinal", , Wave2!D2:D${e2}, Wave1!D2:D${e1})`);
  label(ck, 'A8', 'income map (handle)', false);
  formula(ck, 'B8', `REMAP.FIT(Wave2!B2:B${e2}, Wave1!B2:B${e1}, "quantile", "", Wave2!D2:D${e2}, Wave1!D2:D${e1})`);
  label(ck, 'A9', 'satisfaction map (handle)', false);
  formula(ck, 'B9', `REMAP.FIT(Wave2!C2:C${e2}, Wave1!C2:C${e1}, "ordinal", "", Wave2!D2:D${e2}, Wave1!D2:D${e1})`);
  label(ck, 'A11', 'REMAP.REPORT(B8): the income map');
  formula(ck, 'A12', 'REMAP.REPORT(B8)', REPORT_ROWS, 2);
  label(ck, 'D11', 'REMAP.REPORT(B9): the satisfaction map');
  ck.getColumn(4).width = 34;
  ck.getColumn(5).width = 40;
  formula(ck, 'D12', 'REMAP.REPORT(B9)', REPORT_ROWS, 2);
  return wb;
}

/** 2. Model scenarios aligned to a reference set by three methods. */
function scenarioAlignment(): Workbook {
  const model = readData('scenarios-model.csv');
  const ref = readData('scenarios-reference.csv');
  const n = model.length - 1;
  const e = n + 1;
  const eE = DEMO_ENTROPIC_ROWS + 1;
  const wb = newWorkbook();
  const fits: [string, string, string][] = [
    ['linear', `REMAP.FIT(Model!A2:C${e}, Reference!A2:C${e}, "linear")`, `REMAP.COST(Model!A2:C${e}, Reference!A2:C${e}, "linear")`],
    ['entropic', `REMAP.FIT(Model!A2:C${eE}, Reference!A2:C${eE}, "entropic", "seed=7")`, `REMAP.COST(Model!A2:C${eE}, Reference!A2:C${eE}, "entropic", "seed=7")`],
    [
      'gradient-net',
      `REMAP.FIT(Model!A2:C${e}, Reference!A2:C${e}, "gradient-net", "${DEMO_GRADIENT_NET_SETTINGS}")`,
      `REMAP.COST(Model!A2:C${e}, Reference!A2:C${e}, "gradient-net", "${DEMO_GRADIENT_NET_SETTINGS}")`,
    ],
  ];
  about(wb, 'Aligning a model\'s scenarios to a reference set (invented data)', [
    `An in-house model produced ${n.toLocaleString('en-US')} invented scenarios of three risk factors (a rate shock in basis points, an equity return in percent, a credit spread change in basis points). A reference set of the same size has fatter tails, a skewed equity factor and stronger joint moves in stress. The aim: move each model scenario so that the set as a whole looks like the reference, jointly, not one column at a time, while keeping the order of scenarios (a monotone map).`,
    'Sheet Fits fits three maps side by side with REMAP.FIT and gives each one\'s cost with REMAP.COST:',
    ...fits.map((f) => `=${f[1]}`),
    `linear matches means and covariances (the Gaussian map, closed form). entropic follows the whole joint shape (Sinkhorn and the entropic map); its kernel grows with rows squared, so this demo fits it on the first ${DEMO_ENTROPIC_ROWS.toLocaleString('en-US')} scenarios of each set and then applies it to all ${n.toLocaleString('en-US')}. gradient-net trains a neural map that is monotone by construction; its settings here ("${DEMO_GRADIENT_NET_SETTINGS}") are kept modest so the demo runs in about a minute; more steps fit better.`,
    'Sheet Aligned applies each map to every model scenario with REMAP.APPLY, e.g. =REMAP.APPLY(Fits!B2, Model!A2:C' + e + ').',
    'Sheet Reports lists REMAP.REPORT for each map: the cost, the energy distance between the scenarios and the reference before and after (lower after is better), the largest KS statistic per column after, whether an iterative fit converged, and warnings.',
  ]);
  dataSheet(wb, 'Model', model, [16, 18, 18]);
  dataSheet(wb, 'Reference', ref, [16, 18, 18]);
  const fs_ = wb.addWorksheet('Fits');
  [16, 46, 18].forEach((w, i) => (fs_.getColumn(i + 1).width = w));
  label(fs_, 'A1', 'method');
  label(fs_, 'B1', 'map (REMAP.FIT handle)');
  label(fs_, 'C1', 'cost (squared W2)');
  fits.forEach(([m, fit, cost], i) => {
    fs_.getCell(`A${i + 2}`).value = m;
    formula(fs_, `B${i + 2}`, fit);
    formula(fs_, `C${i + 2}`, cost);
  });
  const al = wb.addWorksheet('Aligned');
  const cols = ['rate_shock_bp', 'equity_return_pct', 'spread_change_bp'];
  fits.forEach(([m], i) => {
    const c0 = i * 4;
    cols.forEach((name, k) => {
      label(al, a1(0, c0 + k), `${name} (${m})`);
      al.getColumn(c0 + k + 1).width = 20;
    });
    formula(al, a1(1, c0), `REMAP.APPLY(Fits!B${i + 2}, Model!A2:C${e})`, n, 3);
  });
  al.views = [{ state: 'frozen', ySplit: 1 }];
  const rp = wb.addWorksheet('Reports');
  fits.forEach(([m], i) => {
    const c0 = i * 3;
    label(rp, a1(0, c0), `REMAP.REPORT(Fits!B${i + 2}): ${m}`);
    rp.getColumn(c0 + 1).width = 30;
    rp.getColumn(c0 + 2).width = 34;
    rp.getColumn(c0 + 3).width = 3;
    formula(rp, a1(1, c0), `REMAP.REPORT(Fits!B${i + 2})`, REPORT_ROWS, 2);
  });
  return wb;
}

/** 3. North's sales re-shaped to South's distribution and back. */
function whatIf(): Workbook {
  const north = readData('sales-north.csv');
  const south = readData('sales-south.csv');
  const eN = north.length;
  const eS = south.length;
  const nN = eN - 1;
  const wb = newWorkbook();
  about(wb, 'What if North\'s stores sold like South\'s? (invented data)', [
    `Monthly sales of ${nN} invented stores in the North region and ${eS - 1} in the South. The South's distribution has a different shape (a long plateau of mid-sized stores). The question: what would each North store's sales be if the North had the South's distribution but every store kept its rank?`,
    'Sheet WhatIf fits the map once and keeps its handle in B1:',
    `=REMAP.FIT(North!B2:B${eN}, South!B2:B${eS})`,
    'Sheet North, column C applies it to every store (=REMAP.APPLY(WhatIf!B1, B2:B' + eN + ')) and column D maps those values back with the inverse (=REMAP.INVERT(WhatIf!B1, C2:C' + eN + ')), which gives the original sales again; WhatIf!B4 checks that the round trip is exact.',
    'WhatIf also answers one-off questions: what a North store selling 62,000 would sell in the South (=REMAP.APPLY(B1, 62000)), and what a South store selling 100,000 would be in the North (=REMAP.INVERT(B1, 100000)). The percentile table compares North, North re-shaped, and South; the middle and right columns agree up to interpolation.',
    'REMAP.REPORT(B1) at the bottom lists the map\'s diagnostics. Try typing another value in B6 or B7.',
  ]);
  const wn = dataSheet(wb, 'North', north, [10, 16, 18, 18]);
  label(wn, 'C1', 'as if in the South');
  label(wn, 'D1', 'mapped back');
  formula(wn, 'C2', `REMAP.APPLY(WhatIf!B1, B2:B${eN})`, nN, 1);
  formula(wn, 'D2', `REMAP.INVERT(WhatIf!B1, C2:C${eN})`, nN, 1);
  [2, 3, 4].forEach((c) => (wn.getColumn(c).numFmt = '#,##0'));
  dataSheet(wb, 'South', south, [10, 16]);
  const wi = wb.addWorksheet('WhatIf');
  wi.getColumn(1).width = 46;
  [18, 18, 18].forEach((w, i) => (wi.getColumn(i + 2).width = w));
  label(wi, 'A1', 'map North -> South (handle)', false);
  formula(wi, 'B1', `REMAP.FIT(North!B2:B${eN}, South!B2:B${eS})`);
  label(wi, 'A2', 'cost (squared W2)', false);
  formula(wi, 'B2', `REMAP.COST(North!B2:B${eN}, South!B2:B${eS})`);
  label(wi, 'A3', 'typical move (W2, in sales)', false);
  formula(wi, 'B3', 'SQRT(B2)');
  label(wi, 'A4', 'round trip: root mean square of (mapped back - original)', false);
  formula(wi, 'B4', `SQRT(SUMXMY2(North!D2:D${eN}, North!B2:B${eN})/ROWS(North!B2:B${eN}))`);
  label(wi, 'A6', 'North sales of', false);
  wi.getCell('B6').value = 62000;
  label(wi, 'C6', 'would be in the South:', false);
  formula(wi, 'D6', 'REMAP.APPLY(B1, B6)');
  label(wi, 'A7', 'South sales of', false);
  wi.getCell('B7').value = 100000;
  label(wi, 'C7', 'would be in the North:', false);
  formula(wi, 'D7', 'REMAP.INVERT(B1, B7)');
  label(wi, 'A9', 'percentile');
  label(wi, 'B9', 'North');
  label(wi, 'C9', 'North re-shaped');
  label(wi, 'D9', 'South');
  [0.1, 0.25, 0.5, 0.75, 0.9].forEach((p, i) => {
    const r = 10 + i;
    wi.getCell(`A${r}`).value = p;
    formula(wi, `B${r}`, `PERCENTILE(North!B2:B${eN}, A${r})`);
    formula(wi, `C${r}`, `PERCENTILE(North!C2:C${eN}, A${r})`);
    formula(wi, `D${r}`, `PERCENTILE(South!B2:B${eS}, A${r})`);
  });
  ['B', 'C', 'D'].forEach((c) => (wi.getColumn(c).numFmt = '#,##0'));
  label(wi, 'A16', 'REMAP.REPORT(B1)');
  formula(wi, 'A17', 'REMAP.REPORT(B1)', REPORT_ROWS, 2);
  // the round-trip figure is tiny: show it plainly
  wi.getCell('B4').numFmt = 'General';
  return wb;
}

export const DEMO_WORKBOOKS: readonly DemoWorkbook[] = [
  {
    file: 'survey-waves.xlsx',
    title: 'Survey waves (Harbourside Living Conditions Survey, two independent waves)',
    build: surveyWaves,
    plots: [
      {
        file: 'survey-income-ecdf.svg',
        kind: 'ecdf',
        title: 'Income: wave 2 on wave 1\'s scale (weighted)',
        xLabel: 'income',
        series: [
          { name: 'wave 1', range: 'Wave1!B2:B1201', weights: 'Wave1!D2:D1201' },
          { name: 'wave 2 as asked', range: 'Wave2!B2:B1001', weights: 'Wave2!D2:D1001' },
          { name: 'wave 2 harmonised', range: 'Wave2!F2:F1001', weights: 'Wave2!D2:D1001' },
        ],
      },
      {
        file: 'survey-income-qq.svg',
        kind: 'qq',
        title: 'Income quantiles against wave 1 (weighted)',
        series: [
          { name: 'wave 1', range: 'Wave1!B2:B1201', weights: 'Wave1!D2:D1201' },
          { name: 'wave 2 as asked', range: 'Wave2!B2:B1001', weights: 'Wave2!D2:D1001' },
          { name: 'wave 2 harmonised', range: 'Wave2!F2:F1001', weights: 'Wave2!D2:D1001' },
        ],
      },
      {
        file: 'survey-satisfaction-histogram.svg',
        kind: 'histogram',
        title: 'Satisfaction (0-10): wave 2 on wave 1\'s scale (weighted)',
        bins: 11,
        range: [-0.5, 10.5],
        xLabel: 'score',
        series: [
          { name: 'wave 1', range: 'Wave1!C2:C1201', weights: 'Wave1!D2:D1201' },
          { name: 'wave 2 as asked', range: 'Wave2!C2:C1001', weights: 'Wave2!D2:D1001' },
          { name: 'wave 2 harmonised', range: 'Wave2!G2:G1001', weights: 'Wave2!D2:D1001' },
        ],
      },
    ],
  },
  {
    file: 'scenario-alignment.xlsx',
    title: 'Scenario alignment (model -> reference, 3 risk factors)',
    build: scenarioAlignment,
    compareOn: { source: 'Model!A2:C5001', target: 'Reference!A2:C5001' },
    plots: [
      {
        file: 'scenarios-before-scatter.svg',
        kind: 'scatter',
        title: 'Equity return against spread change: model as run',
        xLabel: 'equity_return_pct',
        yLabel: 'spread_change_bp',
        series: [
          { name: 'reference', range: 'Reference!B2:B5001', y: 'Reference!C2:C5001' },
          { name: 'model as run', range: 'Model!B2:B5001', y: 'Model!C2:C5001' },
        ],
      },
      ...(['linear', 'entropic', 'gradient-net'] as const).map((m, i): PlotSpec => {
        const c = (k: number) => a1(1, i * 4 + k).replace(/\d+$/, '');
        return {
          file: `scenarios-${m}-scatter.svg`,
          kind: 'scatter',
          title: `Equity return against spread change: aligned by ${m}`,
          xLabel: 'equity_return_pct',
          yLabel: 'spread_change_bp',
          series: [
            { name: 'reference', range: 'Reference!B2:B5001', y: 'Reference!C2:C5001' },
            { name: `model aligned (${m})`, range: `Aligned!${c(1)}2:${c(1)}5001`, y: `Aligned!${c(2)}2:${c(2)}5001` },
          ],
        };
      }),
      {
        file: 'scenarios-equity-ecdf.svg',
        kind: 'ecdf',
        title: 'Equity return: reference, model, and the three alignments',
        xLabel: 'equity_return_pct',
        series: [
          { name: 'reference', range: 'Reference!B2:B5001' },
          { name: 'model as run', range: 'Model!B2:B5001' },
          { name: 'linear', range: 'Aligned!B2:B5001' },
          { name: 'entropic', range: 'Aligned!F2:F5001' },
          { name: 'gradient-net', range: 'Aligned!J2:J5001' },
        ],
      },
    ],
  },
  {
    file: 'what-if.xlsx',
    title: 'What-if (North sales re-shaped to South)',
    build: whatIf,
    plots: [
      {
        file: 'what-if-ecdf.svg',
        kind: 'ecdf',
        title: 'Monthly sales: North, South, and North re-shaped',
        xLabel: 'monthly sales',
        series: [
          { name: 'South', range: 'South!B2:B601' },
          { name: 'North', range: 'North!B2:B401' },
          { name: 'North re-shaped', range: 'North!C2:C401' },
        ],
      },
      {
        file: 'what-if-qq.svg',
        kind: 'qq',
        title: 'Sales quantiles against the South',
        series: [
          { name: 'South', range: 'South!B2:B601' },
          { name: 'North', range: 'North!B2:B401' },
          { name: 'North re-shaped', range: 'North!C2:C401' },
        ],
      },
    ],
  },
];

/** Writes every demo workbook into `dir` (default demo-workbooks/). Returns the paths. */
export async function makeDemoWorkbooks(dir: string = DEMO_DIR): Promise<string[]> {
  fs.mkdirSync(dir, { recursive: true });
  const out: string[] = [];
  for (const d of DEMO_WORKBOOKS) {
    const p = path.join(dir, d.file);
    await d.build().xlsx.writeFile(p);
    out.push(p);
  }
  return out;
}

if (require.main === module) {
  makeDemoWorkbooks().then(
    (paths) => console.log(`wrote ${paths.map((p) => path.relative(process.cwd(), p)).join(', ')}`),
    (e) => {
      console.error(e instanceof Error ? e.message : String(e));
      process.exit(1);
    },
  );
}
