import { Workbook } from 'exceljs';
import { fitMap } from '../../src/engine/methods';
import { sample } from '../../src/engine/points';
import { forgetAll, recall } from '../../src/fits';
import { runWorkbook } from '../../src/headless/run-workbook';

afterEach(() => forgetAll());

const SRC = Object.freeze(Array.from({ length: 40 }, (_, i) => [Math.sin(i) * 3 + i / 10, Math.cos(i * 0.7) * 2]));
const TGT = Object.freeze(Array.from({ length: 50 }, (_, i) => [Math.sin(i * 1.3) * 5 + 2, Math.cos(i * 0.4) * 4 - 1 + i / 20]));

function workbook(fitFormula: string): Workbook {
  const wb = new Workbook();
  const s = wb.addWorksheet('Source');
  s.addRow(['a', 'b']);
  SRC.forEach((r) => s.addRow([...r]));
  const t = wb.addWorksheet('Target');
  t.addRow(['a', 'b']);
  TGT.forEach((r) => t.addRow([...r]));
  const f = wb.addWorksheet('Fit');
  f.getCell('A1').value = { formula: fitFormula } as never;
  f.getCell('A2').value = { formula: 'REMAP.APPLY(A1, Source!A2:B41)', shareType: 'array', ref: 'A2:B41' } as never;
  f.getCell('D1').value = { formula: 'REMAP.REPORT(A1)' } as never;
  return wb;
}

describe('runWorkbook', () => {
  test('calculates REMAP formulas with the numbers the engine gives when called directly, in one pass for a synchronous fit', async () => {
    // Source: src/engine fitMap + apply called directly on the same data
    const r = await runWorkbook(workbook('REMAP.FIT(Source!A2:B41, Target!A2:B51, "linear")'));
    expect(r.passes).toBe(1);
    const map = await fitMap('linear', sample(SRC as number[][]), sample(TGT as number[][]));
    const expected = map.apply({ n: 40, d: 2, data: Float64Array.from(SRC.flat()) });
    const apply = r.formulas.find((f) => f.cell.address === 'A2')!;
    expect(apply.block).toHaveLength(40);
    for (let i = 0; i < 40; i++) for (let k = 0; k < 2; k++) expect(apply.block[i][k]).toBe(expected.data[i * 2 + k]);
    // written back: an array formula over the block, cached values in place
    const ws = r.workbook.getWorksheet('Fit')!;
    expect((ws.getCell('A2').value as { ref?: string }).ref).toBe('A2:B41');
    expect(ws.getCell('B41').value).toBe(expected.data[79]);
    expect(r.values.Fit[0][3]).toBe('Method');
  });
  test('waits for a fit that trains in the background, then evaluates again and finds it under the same handle', async () => {
    // Source: src/engine fitMap (gradient-net, steps=0: the Gaussian warm start, deterministic) called directly
    const r = await runWorkbook(workbook('REMAP.FIT(Source!A2:B41, Target!A2:B51, "gradient-net", "steps=0; seed=3")'));
    expect(r.passes).toBe(2);
    const handle = r.formulas[0].block[0][0];
    expect(typeof handle).toBe('string');
    expect(String(handle)).toMatch(/^remap:gradient-net:40x2:/);
    const stored = recall(String(handle))!;
    const direct = await fitMap('gradient-net', sample(SRC as number[][]), sample(TGT as number[][]), { steps: 0, seed: 3 });
    const x = { n: 40, d: 2, data: Float64Array.from(SRC.flat()) };
    const want = direct.apply(x).data;
    expect(Array.from(stored.apply(x).data)).toEqual(Array.from(want));
    const apply = r.formulas.find((f) => f.cell.address === 'A2')!;
    expect(apply.block[0][0]).toBe(want[0]);
    direct.dispose();
  });
  test('a failing fit gives its error in the cell, and formulas depending on it an error too', async () => {
    // Source: src/functions/excel-errors.ts (unknown method -> #VALUE! with the list of methods)
    const r = await runWorkbook(workbook('REMAP.FIT(Source!A2:B41, Target!A2:B51, "nope")'));
    const fit = r.formulas[0].block[0][0] as { error: string; message: string };
    expect(fit.error).toBe('#VALUE!');
    expect(fit.message).toMatch(/Unknown method/);
    const apply = r.formulas.find((f) => f.cell.address === 'A2')!;
    expect(apply.block).toHaveLength(1);
    expect(apply.block[0][0]).toHaveProperty('error');
  });
});
