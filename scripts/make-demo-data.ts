/* Generates the invented demo data in demo-workbooks/data/ from fixed seeds.
 * Run: npx tsx scripts/make-demo-data.ts   (the output is committed; rerunning gives identical files)
 *
 * Scenarios (all invented for Remap's demos):
 * 1. Survey waves: two independent waves of the "Harbourside Living Conditions Survey" (a repeated cross-section). Wave 2 used a new
 *    questionnaire: income was asked net of a levy (lower, more compressed) and the 0-10
 *    satisfaction question had friendlier wording (scores drift up). Each row has a survey weight.
 * 2. Scenario alignment: 5,000 scenarios of three risk factors from an in-house model,
 *    and a reference set of 5,000 with fatter tails, skew and stronger dependence.
 * 3. Quick what-if: monthly sales per store in two regions, North and South. */
import * as fs from 'fs';
import * as path from 'path';
import { formatCSV } from '../src/cli/csv';
import { Random } from '../src/engine/stats/random';

const dir = path.join(__dirname, '..', 'demo-workbooks', 'data');
fs.mkdirSync(dir, { recursive: true });
const round = (x: number, digits: number) => Number(x.toFixed(digits));
const write = (name: string, rows: (string | number)[][]) => fs.writeFileSync(path.join(dir, name), formatCSV(rows));

function surveyWave(seed: number, n: number, wave: 1 | 2): (string | number)[][] {
  const r = new Random(seed);
  const rows: (string | number)[][] = [['household', 'income', 'satisfaction', 'weight']];
  for (let i = 0; i < n; i++) {
    const z = r.normal();
    let income = Math.exp(10.4 + 0.55 * z);
    if (wave === 2) income = 0.82 * Math.pow(income, 0.97) + 1500;
    // satisfaction rises with income a little; wave 2's wording lifts scores
    const latent = 5.6 + 0.9 * z + 1.6 * r.normal() + (wave === 2 ? 0.9 : 0);
    const score = Math.max(0, Math.min(10, Math.round(latent)));
    const weight = round(0.4 + 1.6 * r.uniform() + (z < -0.8 ? 0.8 : 0), 3);
    rows.push([`W${wave}-${String(i + 1).padStart(4, '0')}`, Math.round(income / 10) * 10, score, weight]);
  }
  return rows;
}

function scenarios(seed: number, n: number, reference: boolean): (string | number)[][] {
  const r = new Random(seed);
  const rows: (string | number)[][] = [['rate_shock_bp', 'equity_return_pct', 'spread_change_bp']];
  for (let i = 0; i < n; i++) {
    const a = r.normal();
    const b = r.normal();
    const c = r.normal();
    if (!reference) {
      rows.push([round(20 * a, 3), round(6 + 14 * (0.3 * a + 0.95 * b), 3), round(35 * (0.5 * b + 0.85 * c) * -1 + 5, 3)]);
    } else {
      // fatter tails (a scale mixture), a skewed equity factor, stronger joint moves in stress
      const s = r.uniform() < 0.12 ? 2.2 : 1;
      const eq = 5 + 16 * (0.25 * a + 0.95 * b) * s - 4 * (Math.exp(0.35 * b) - 1.06);
      const spread = -45 * (0.65 * b + 0.75 * c) * s + 0.08 * (eq < -10 ? (eq + 10) * (eq + 10) : 0);
      rows.push([round(24 * a * s, 3), round(eq, 3), round(spread, 3)]);
    }
  }
  return rows;
}

function sales(seed: number, n: number, region: 'North' | 'South'): (string | number)[][] {
  const r = new Random(seed);
  const rows: (string | number)[][] = [['store', 'monthly_sales']];
  for (let i = 0; i < n; i++) {
    const v = region === 'North' ? Math.exp(11 + 0.35 * r.normal()) : 40_000 + 95_000 * Math.pow(r.uniform(), 1.8) + 8_000 * r.normal();
    rows.push([`${region[0]}${String(i + 1).padStart(3, '0')}`, Math.max(1000, Math.round(v))]);
  }
  return rows;
}

write('survey-wave1.csv', surveyWave(101, 1200, 1));
write('survey-wave2.csv', surveyWave(202, 1000, 2));
write('scenarios-model.csv', scenarios(303, 5000, false));
write('scenarios-reference.csv', scenarios(404, 5000, true));
write('sales-north.csv', sales(505, 400, 'North'));
write('sales-south.csv', sales(606, 600, 'South'));
console.log(`wrote demo data to ${path.relative(process.cwd(), dir)}`);
