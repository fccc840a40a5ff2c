import { execFileSync, spawnSync } from 'child_process';
import * as path from 'path';
import { runCli as run } from '../helpers/run-cli';

const S = 'id,x,w\na,3,1\nb,1,1\nc,2,2\n';
const T = 'id,x,w\na,30,1\nb,10,1\nc,20,1\n';

describe('remap command line', () => {
  test("fit writes map JSON; apply maps the model's columns and passes others through, same header", async () => {
    const files: Record<string, string> = { 's.csv': S, 't.csv': T };
    const fit = await run(['fit', '--source', 's.csv', '--target', 't.csv', '--columns', 'x', '--out', 'm.json'], files);
    expect(fit.code).toBe(0);
    expect(JSON.parse(files['m.json']).method).toBe('quantile');
    const apply = await run(['apply', '--model', 'm.json', '--input', 's.csv'], files);
    expect(apply.code).toBe(0);
    // Source: equal sizes map to the sorted matching (fact of the trade)
    expect(apply.out).toBe('id,x,w\na,30,1\nb,10,1\nc,20,2\n');
    const inv = await run(['invert', '--model', 'm.json', '--input', 't.csv', '--out', 'back.csv'], files);
    expect(inv.code).toBe(0);
    expect(files['back.csv']).toBe('id,x,w\na,3,1\nb,1,1\nc,2,1\n');
  });

  test('cost prints JSON with method, w2_squared and w2', async () => {
    const r = await run(['cost', '--source', 's.csv', '--target', 't.csv', '--columns', 'x'], { 's.csv': S, 't.csv': T });
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    // Source: sorted matching (1,2,3) -> (10,20,30): mean of 9^2, 18^2, 27^2 = (81 + 324 + 729) / 3 = 378
    expect(j.method).toBe('quantile');
    expect(j.w2_squared).toBeCloseTo(378, 10);
    expect(j.w2).toBeCloseTo(Math.sqrt(378), 10);
  });

  test('cost JSON says what the figure is; fit prints the label beside the number and the reminder', async () => {
    const files: Record<string, string> = { 's.csv': S, 't.csv': T };
    const j = JSON.parse((await run(['cost', '--source', 's.csv', '--target', 't.csv', '--columns', 'x'], files)).out);
    // Source: design choice (one column with quantile: the exact squared W2)
    expect(j).toMatchObject({ bound: 'exact', label: 'squared W2, exact' });
    const two = 'a,b\n0,1\n1,0\n2,3\n3,1\n4,4\n5,2\n6,7\n7,5\n';
    const two2 = 'a,b\n5,2\n6,1\n8,4\n9,7\n3,3\n12,10\n4,8\n15,11\n';
    const lin = JSON.parse((await run(['cost', '--source', 'a.csv', '--target', 'b.csv', '--method', 'linear'], { 'a.csv': two, 'b.csv': two2 })).out);
    // Source: design choice (Gelbrich 1990: the Gaussian figure is a lower bound)
    expect(lin.bound).toBe('lower');
    expect(lin.label).toMatch(/lower bound/);
    const fit = await run(['fit', '--source', 'a.csv', '--target', 'b.csv', '--method', 'linear', '--out', 'm.json'], { 'a.csv': two, 'b.csv': two2 });
    expect(fit.err).toMatch(/cost \(squared W2, lower bound [^)]*\)\) [0-9.]+; wrote m\.json/);
    expect(fit.err).toMatch(/held-out data/);
  });

  test('apply and invert warn on stderr about their own rows outside the fitted range, in words', async () => {
    const files: Record<string, string> = { 's.csv': S, 't.csv': T, 'x.csv': 'x\n0\n2\n4\n', 'y.csv': 'x\n20\n25\n' };
    await run(['fit', '--source', 's.csv', '--target', 't.csv', '--columns', 'x', '--out', 'm.json'], files);
    const apply = await run(['apply', '--model', 'm.json', '--input', 'x.csv'], files);
    expect(apply.code).toBe(0);
    // Source: counted by hand: the source range is [1, 3]; 0 and 4 lie outside, 2 does not
    expect(apply.err).toMatch(/^remap: warning: 2 of 3 rows \(66\.7%\) lay outside the source range .*clamped/);
    expect(apply.err).not.toMatch(/\(clamp\)\.$/m);
    const inv = await run(['invert', '--model', 'm.json', '--input', 'y.csv'], files);
    // Source: counted by hand: 20 and 25 lie inside the target range [10, 30]
    expect(inv.err).toBe('');
  });

  test('weights come from a named column and change the result', async () => {
    const files = { 's.csv': S, 't.csv': T };
    const plain = JSON.parse((await run(['cost', '--source', 's.csv', '--target', 't.csv', '--columns', 'x'], files)).out);
    const weighted = JSON.parse((await run(['cost', '--source', 's.csv', '--target', 't.csv', '--columns', 'x', '--source-weights', 'w'], files)).out);
    expect(weighted.w2_squared).not.toBeCloseTo(plain.w2_squared, 3);
  });

  test('without --columns every numeric column is used; quantile on several columns says dependence is not matched', async () => {
    const two = 'a,b\n1,5\n2,3\n3,9\n4,1\n';
    const r = await run(['fit', '--source', 's.csv', '--target', 't.csv', '--method', 'quantile', '--out', 'm.json'], { 's.csv': two, 't.csv': two });
    expect(r.code).toBe(0);
    expect(r.err).toMatch(/dependence/i);
  });

  test('report prints the diagnostics as JSON', async () => {
    const files: Record<string, string> = { 's.csv': S, 't.csv': T };
    await run(['fit', '--source', 's.csv', '--target', 't.csv', '--columns', 'x', '--out', 'm.json'], files);
    const r = await run(['report', '--model', 'm.json'], files);
    expect(JSON.parse(r.out).method).toBe('quantile');
  });

  test('bad input exits 1 with one line on stderr that says what to fix; bad usage exits 2', async () => {
    const files = { 's.csv': S, 't.csv': T, 'bad.csv': 'x\n1\nNaN\n' };
    const missing = await run(['fit', '--source', 'nope.csv', '--target', 't.csv', '--out', 'm.json'], files);
    expect(missing.code).toBe(1);
    expect(missing.err).toBe('remap: cannot read nope.csv (ENOENT); check the path.\n');
    const nan = await run(['cost', '--source', 'bad.csv', '--target', 't.csv', '--columns', 'x'], files);
    expect(nan.code).toBe(1);
    expect(nan.err).toMatch(/^remap: .*non-finite number \(NaN\) in row 2.*\n$/);
    expect(nan.err.split('\n').length).toBe(2);
    const unknown = await run(['fit', '--colour', 'red'], files);
    expect(unknown.code).toBe(2);
    expect(unknown.err).toMatch(/fit has no option --colour; its options are --source/);
    const noOut = await run(['fit', '--source', 's.csv', '--target', 't.csv'], files);
    expect(noOut.code).toBe(2);
    expect(noOut.err).toMatch(/fit needs --out/);
    const badJson = await run(['apply', '--model', 's.csv', '--input', 's.csv'], files);
    expect(badJson.code).toBe(1);
    expect(badJson.err).toMatch(/Map JSON could not be read/);
  });

  test('the installed command runs through npx-style bin/remap.js and exits non-zero without a stack trace', () => {
    const bin = path.join(__dirname, '..', '..', 'bin', 'remap.js');
    const ok = execFileSync(process.execPath, [bin, 'methods'], { encoding: 'utf8' });
    expect(ok).toMatch(/^quantile /m);
    const bad = spawnSync(process.execPath, [bin, 'cost', '--source', 'nope.csv', '--target', 'nope.csv'], { encoding: 'utf8' });
    expect(bad.status).toBe(1);
    expect(bad.stderr).toBe('remap: cannot read nope.csv (ENOENT); check the path.\n');
  });
});

describe('remap --method and --seed', () => {
  const two = 'a,b\n' + Array.from({ length: 40 }, (_, i) => `${Math.sin(i)},${Math.cos(2 * i)}`).join('\n') + '\n';
  const twoT = 'a,b\n' + Array.from({ length: 40 }, (_, i) => `${2 * Math.sin(i) + 1},${Math.cos(2 * i) ** 3}`).join('\n') + '\n';

  test('--seed is accepted by every method; methods without randomness ignore it', async () => {
    for (const m of ['linear', 'pairs', 'entropic']) {
      const r = await run(['cost', '--source', 's.csv', '--target', 't.csv', '--method', m, '--seed', '3'], { 's.csv': two, 't.csv': twoT });
      expect({ m, code: r.code, err: r.err }).toEqual({ m, code: 0, err: '' });
      expect(JSON.parse(r.out).method).toBe(m);
    }
  });

  test('auto says what it chose and why', async () => {
    const r = await run(['cost', '--source', 's.csv', '--target', 't.csv', '--method', 'auto'], { 's.csv': two, 't.csv': twoT });
    const j = JSON.parse(r.out);
    expect(j.method).toBe('entropic');
    expect(j.method_reason).toMatch(/entropic map fits in seconds/);
  });
});
