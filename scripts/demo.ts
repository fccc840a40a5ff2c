/* The main job on the bundled, invented demo data: calculates each demo
 * workbook without Excel (HyperFormula running the REMAP functions through the
 * same code as the add-in), writes the filled workbooks and before/after plots
 * to demo-output/, and prints what each map did.
 * Run: npm run demo        (about a minute on 2 cores) */
import * as fs from 'fs';
import * as path from 'path';
import { COMPARISON_MAX_ROWS, COMPARISON_SEED, compareOn } from '../src/engine/assess';
import { recall } from '../src/fits/store';
import { formatSummary, short, summariseFormulas } from '../src/headless/fit-summary';
import { rangeNumbers } from '../src/headless/range-values';
import { renderPlot } from '../src/headless/plot-spec';
import { runWorkbook } from '../src/headless/run-workbook';
import { DEMO_DIR, DEMO_WORKBOOKS, makeDemoWorkbooks } from './make-demo-workbooks';

export const OUTPUT_DIR = path.join(__dirname, '..', 'demo-output');

/** Runs every demo workbook; returns the number of formulas that ended in an error. */
export async function runDemo(outDir: string = OUTPUT_DIR, log: (line: string) => void = console.log): Promise<number> {
  const t0 = Date.now();
  if (DEMO_WORKBOOKS.some((d) => !fs.existsSync(path.join(DEMO_DIR, d.file)))) {
    log('Demo workbooks missing: building them from demo-workbooks/data/ ...');
    await makeDemoWorkbooks();
  }
  fs.mkdirSync(outDir, { recursive: true });
  let errors = 0;
  for (const d of DEMO_WORKBOOKS) {
    const r = await runWorkbook(path.join(DEMO_DIR, d.file));
    const out = path.join(outDir, d.file);
    await r.workbook.xlsx.writeFile(out);
    const summary = summariseFormulas(r.formulas);
    errors += summary.errors.length;
    log('');
    log(
      `${d.title}: ${d.file}  (${r.formulas.length} formulas, ${(r.elapsedMs / 1000).toFixed(1)} ` +
        `s${r.passes > 1 ? `, ${r.passes} passes: waited for background fits` : ''})`,
    );
    for (const line of formatSummary(summary)) log(line);
    if (d.compareOn) for (const line of sameRowsComparison(summary, r.values, d.compareOn)) log(line);
    const plots: string[] = [];
    for (const spec of d.plots) {
      fs.writeFileSync(path.join(outDir, spec.file), renderPlot(spec, r.values));
      plots.push(spec.file);
    }
    log(`  wrote ${path.relative(process.cwd(), out)} and plots ${plots.join(', ')}`);
  }
  log('');
  log(
    `Done in ${((Date.now() - t0) / 1000).toFixed(1)} s; ` +
      `${errors === 0 ? 'every formula calculated' : `${errors} formula${errors === 1 ? '' : 's'} gave errors (see above)`}. Open the .xlsx files ` +
      `in demo-output/ to see the formulas with their results; the .svg plots open in any browser.`,
  );
  return errors;
}

/**
 * Each fitted map of a workbook compared on the same rows (compareOn), so that
 * maps fitted on different rows (the entropic fit uses fewer) can be put side
 * by side; a map that cannot map the rows says why. O(maps x compareOn's cost).
 */
function sameRowsComparison(
  summary: ReturnType<typeof summariseFormulas>,
  values: Parameters<typeof rangeNumbers>[0],
  ranges: { source: string; target: string },
): string[] {
  const s = rangeNumbers(values, ranges.source);
  const t = rangeNumbers(values, ranges.target);
  const source = { n: s.rows, d: s.cols, data: s.data, weights: null };
  const target = { n: t.rows, d: t.cols, data: t.data, weights: null };
  const lines = [`  Every map compared on the same ${s.rows.toLocaleString('en-US')} rows (${ranges.source} onto ${ranges.target}):`];
  for (const f of summary.fits) {
    const map = f.handle ? recall(f.handle) : undefined;
    if (!map) continue;
    try {
      const c = compareOn(map, source, target);
      lines.push(
        `      ${map.method.padEnd(12)} energy distance ${short(c.energyBefore)} -> ${short(c.energyAfter)}   largest KS after ${short(c.ksMaxAfter)}`,
      );
    } catch (e) {
      lines.push(`      ${map.method.padEnd(12)} not compared: ${(e as Error).message}`);
    }
  }
  const note = compareOnNote(source, target);
  if (note) lines.push(`      (${note})`);
  return lines;
}

/** The row note of a comparison on these rows, or '' when there are none. */
function compareOnNote(source: { n: number; d: number }, target: { n: number; d: number }): string {
  const sub = source.d > 1 && (source.n > COMPARISON_MAX_ROWS || target.n > COMPARISON_MAX_ROWS);
  return sub
    ? `energy distances on a seeded subsample of ${COMPARISON_MAX_ROWS.toLocaleString('en-US')} rows per side (seed ${COMPARISON_SEED}), the same rows for every map; KS on every row`
    : '';
}

if (require.main === module) {
  runDemo().then(
    (errors) => process.exit(errors === 0 ? 0 : 1),
    (e) => {
      console.error(e instanceof Error ? (e.stack ?? e.message) : String(e));
      process.exit(1);
    },
  );
}
