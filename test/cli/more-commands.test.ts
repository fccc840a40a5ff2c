import { fitGroupedMapSync } from '../../src/engine/groups/fit-grouped';
import { fitMapSync } from '../../src/engine/methods';
import { runCli } from '../helpers/run-cli';

const csv = (header: string, rows: (string | number)[][]) => [header, ...rows.map((r) => r.join(','))].join('\n') + '\n';

describe('remap fit-groups / apply-groups / fit-table / bounds', () => {
  const src = Array.from({ length: 40 }, (_, i) => [i % 2 === 0 ? 'a' : 'b', ((i * 7) % 13) + (i % 2) * 20, 1 + (i % 3)]);
  const tgt = Array.from({ length: 50 }, (_, i) => [i % 2 === 0 ? 'a' : 'b', ((i * 5) % 17) + 100 + (i % 2) * 50, 1]);
  const files = () => ({
    'S.csv': csv('g,x,w', src),
    'T.csv': csv('g,x,w', tgt),
    'X.csv': csv('g,x', [
      ['a', 3],
      ['b', 25],
      ['a', 9],
    ]),
  });

  test('fit-groups then apply-groups gives each group its own map, as the engine does', async () => {
    const f = files();
    const fit = await runCli(
      [
        'fit-groups',
        '--source',
        'S.csv',
        '--target',
        'T.csv',
        '--columns',
        'x',
        '--source-weights',
        'w',
        '--source-group-column',
        'g',
        '--target-group-column',
        'g',
        '--out',
        'm.json',
      ],
      f,
    );
    expect(fit.code).toBe(0);
    expect(fit.err).toMatch(/in 2 groups/);
    const app = await runCli(['apply-groups', '--model', 'm.json', '--input', 'X.csv', '--group-column', 'g'], f);
    expect(app.code).toBe(0);
    const engine = fitGroupedMapSync(
      'quantile',
      { n: 40, d: 1, data: Float64Array.from(src.map((r) => r[1] as number)), weights: Float64Array.from(src.map((r) => r[2] as number)) },
      src.map((r) => r[0] as string),
      { n: 50, d: 1, data: Float64Array.from(tgt.map((r) => r[1] as number)), weights: null },
      tgt.map((r) => r[0] as string),
    );
    const want = engine.apply({ n: 3, d: 1, data: Float64Array.of(3, 25, 9) }, ['a', 'b', 'a']).data;
    // Source: the engine's own grouped map (the CLI must only carry it through CSV).
    expect(app.out).toBe(`g,x\na,${want[0]}\nb,${want[1]}\na,${want[2]}\n`);
    const missing = await runCli(
      ['fit-groups', '--source', 'S.csv', '--target', 'T.csv', '--columns', 'x', '--source-group-column', 'g', '--out', 'm.json'],
      f,
    );
    expect(missing.code).toBe(2);
  });

  test('fit-table reads a quantile table from CSV', async () => {
    const f: Record<string, string> = {
      'U.csv': csv('u', [[0.1], [0.3], [0.5], [0.7], [0.9]]),
      't.csv': csv('probability,value', [
        [0.1, -1.2815515655446004],
        [0.5, 0],
        [0.9, 1.2815515655446004],
      ]),
      'X.csv': csv('u', [[0.5]]),
    };
    const fit = await runCli(['fit-table', '--source', 'U.csv', '--target-table', 't.csv', '--out', 'm.json'], f);
    expect(fit.code).toBe(0);
    expect(fit.err).toMatch(/target quantile table is coarse \(3 points/);
    const app = await runCli(['apply', '--model', 'm.json', '--input', 'X.csv'], f);
    expect(app.out).toBe('u\n0\n');
    const freq = await runCli(['fit-table', '--source', 'U.csv', '--target-table', 'f.csv', '--out', 'm2.json'], {
      ...f,
      'f.csv': csv('value,count', [
        [1, 2],
        [2, 3],
      ]),
    });
    expect(freq.code).toBe(0);
    const bad = await runCli(['fit-table', '--source', 'U.csv', '--target-table', 'b.csv', '--out', 'm3.json'], { ...f, 'b.csv': csv('p,v', [[0.1, 1]]) });
    expect(bad.code).toBe(1);
    expect(bad.err).toMatch(/needs the columns probability and value/);
  });

  test('bounds writes mapped values with lower and upper bounds, the same for the same seed, and reads replicate weight columns', async () => {
    const f = files();
    const a = await runCli(['bounds', '--source', 'S.csv', '--target', 'T.csv', '--columns', 'x', '--input', 'X.csv', '--replicates', '50', '--seed', '3'], f);
    expect(a.code).toBe(0);
    const lines = a.out.trim().split('\n');
    expect(lines[0]).toBe('x,x_mapped,x_lower,x_upper');
    const [x, mapped, lo, hi] = lines[1].split(',').map(Number);
    expect(x).toBe(3);
    const map = fitMapSync(
      'quantile',
      { n: 40, d: 1, data: Float64Array.from(src.map((r) => r[1] as number)), weights: null },
      { n: 50, d: 1, data: Float64Array.from(tgt.map((r) => r[1] as number)), weights: null },
    );
    expect(mapped).toBe(map.apply({ n: 1, d: 1, data: Float64Array.of(3) }).data[0]);
    expect(lo).toBeLessThanOrEqual(hi);
    const b = await runCli(['bounds', '--source', 'S.csv', '--target', 'T.csv', '--columns', 'x', '--input', 'X.csv', '--replicates', '50', '--seed', '3'], f);
    expect(b.out).toBe(a.out);
    const rw = src.map((r, i) => [...r, i % 4 === 0 ? 0 : 4 / 3, i % 4 === 1 ? 0 : 4 / 3, i % 4 === 2 ? 0 : 4 / 3, i % 4 === 3 ? 0 : 4 / 3]);
    const c = await runCli(
      [
        'bounds',
        '--source',
        'R.csv',
        '--target',
        'T.csv',
        '--columns',
        'x',
        '--input',
        'X.csv',
        '--method',
        'linear',
        '--source-replicates',
        'r*',
        '--replicate-kind',
        'jackknife',
      ],
      { ...f, 'R.csv': csv('g,x,w,r1,r2,r3,r4', rw) },
    );
    expect(c.code).toBe(0);
    expect(c.err).toMatch(/jackknife replicate weights/);
    expect(c.err).toMatch(/No replicate weights were given for the target/);
  });
});
