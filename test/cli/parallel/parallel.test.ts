import * as os from 'os';
import { lineChunks } from '../../../src/cli/parallel/line-chunks';
import { estimateRows, mergeTables, threadUse, workerCount } from '../../../src/cli/parallel/parallel-csv';
import { scanNumericBytes } from '../../../src/cli/numeric-csv';
import { runCli as run } from '../../helpers/run-cli';

/** Rows of three columns from a fixed formula (no randomness): mixed magnitudes, some negative, some ties. */
function table(rows: number, extra: (i: number) => string = () => ''): string {
  const lines = ['a,b,label'];
  for (let i = 0; i < rows; i++) {
    const a = Math.sin(i * 0.7) * 10 ** ((i % 7) - 2);
    const b = ((i * 37) % 101) / 7 - 3;
    lines.push(`${a},${b},r${i % 13}${extra(i)}`);
  }
  return lines.join('\n') + '\n';
}

describe('cutting a CSV file into pieces of whole lines', () => {
  test('cuts after line feeds, behind the header, into about equal pieces', () => {
    // Source: worked by hand: header "x\n" is 2 bytes; the body "1\n2\n3\n4\n" is 8 bytes, halves end after "2\n" and "4\n".
    expect(lineChunks(Buffer.from('x\n1\n2\n3\n4\n'), 2, 1)).toEqual({ headerEnd: 2, cuts: [2, 6, 10] });
    // Source: worked by hand: three pieces of the 8-byte body want cuts at 2 + 2 = 4 (a line starts there) and 2 + 5 = 7
    // (inside the line "3\n" at 6..7, so after it, at 8).
    expect(lineChunks(Buffer.from('x\n1\n2\n3\n4\n'), 3, 1)).toEqual({ headerEnd: 2, cuts: [2, 4, 8, 10] });
  });

  test('never cuts a file with a quote, one piece, or pieces below the smallest size', () => {
    // Source: design choice (a quoted field may hold a line break, so such files are read whole)
    expect(lineChunks(Buffer.from('x\n"1"\n2\n3\n'), 2, 1)).toBeNull();
    expect(lineChunks(Buffer.from('x\n1\n2\n3\n'), 1, 1)).toBeNull();
    expect(lineChunks(Buffer.from('x\n1\n2\n3\n'), 2, 100)).toBeNull();
    expect(lineChunks(Buffer.from('x,y'), 2, 1)).toBeNull();
  });

  test('the pieces read alone and merged are the table read whole, text fields included', () => {
    const text = table(500, (i) => (i % 50 === 3 ? ' x' : ''));
    const bytes = Buffer.from(text);
    const whole = scanNumericBytes(bytes, 'f.csv')!;
    const chunks = lineChunks(bytes, 4, 1)!;
    expect(chunks.cuts.length).toBe(5);
    const parts = chunks.cuts.slice(0, -1).map((from, i) => scanNumericBytes(bytes, 'f.csv', undefined, { from, to: chunks.cuts[i + 1] })!);
    const merged = mergeTables('f.csv', parts)!;
    // Source: the whole-file reader (another path through the same rules) is the reference.
    expect(merged.rows).toBe(whole.rows);
    expect(merged.header).toEqual(whole.header);
    expect(merged.texts).toEqual(whole.texts);
    for (let k = 0; k < 3; k++) {
      expect(Array.from(merged.kinds[k].subarray(0, merged.rows))).toEqual(Array.from(whole.kinds[k].subarray(0, whole.rows)));
      expect(Array.from(merged.values[k].subarray(0, merged.rows))).toEqual(Array.from(whole.values[k].subarray(0, whole.rows)));
    }
  });

  test('a piece that ends in empty lines inside the file is not merged (they are rows of blanks there)', () => {
    const bytes = Buffer.from('x,y\n1,2\n\n\n3,4\n5,6\n');
    const cut = bytes.indexOf('3,4');
    const first = scanNumericBytes(bytes, 'f.csv', undefined, { from: 4, to: cut })!;
    const second = scanNumericBytes(bytes, 'f.csv', undefined, { from: cut, to: bytes.length })!;
    // Source: worked by hand: the first piece reads 3 lines, of which 1 row before the trailing empty lines.
    expect([first.lines, first.rows]).toEqual([3, 1]);
    expect(mergeTables('f.csv', [first, second])).toBeNull();
  });
});

describe('--workers', () => {
  test('a count outside 1..64 is refused with what to give', async () => {
    const r = await run(['apply', '--model', 'm.json', '--input', 'x.csv', '--workers', '0'], { 'm.json': '{}', 'x.csv': 'x\n1\n' });
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/--workers is "0"; give a whole number from 1 to 64/);
    // Source: design choice (inputs below 32 MB stay on one thread unless asked)
    expect(workerCount(undefined, 1000)).toBe(1);
    expect(workerCount('3', 10)).toBe(3);
    // Source: design choice: a small file a heavy map (an entropic one: about 10^5 multiply-adds a row) maps for seconds gets threads.
    expect(workerCount(undefined, 1000, 20_000 * 1e5)).toBe(Math.min(8, os.availableParallelism()));
    // Source: worked by hand: 3 lines of 2 bytes, the header among them.
    expect(estimateRows(Buffer.from('x\n1\n2\n'))).toBe(2);
  });

  test('fit and apply write the same bytes with 1 and 3 threads, warnings included', async () => {
    const files: Record<string, string> = { 's.csv': table(3000), 't.csv': table(2500).replace(/^(-?[\d.e-]+),/gm, (_, a) => `${Number(a) * 3 + 1},`) };
    // Values beyond the fitted range make the outside warning count rows in every piece.
    files['x.csv'] = table(4000).replace(/^(-?[\d.e-]+),/gm, (_, a) => `${Number(a) * 1.5},`);
    const before = { ...threadUse };
    for (const method of ['quantile', 'linear']) {
      const cols = method === 'quantile' ? 'a' : 'a,b';
      const outs: string[] = [];
      const errs: string[] = [];
      for (const workers of ['1', '3']) {
        const fit = await run(
          ['fit', '--method', method, '--columns', cols, '--source', 's.csv', '--target', 't.csv', '--out', `m${workers}.json`, '--workers', workers],
          files,
        );
        expect(fit.code).toBe(0);
        const apply = await run(['apply', '--model', `m${workers}.json`, '--input', 'x.csv', '--workers', workers], files);
        expect(apply.code).toBe(0);
        outs.push(apply.out);
        errs.push(apply.err);
      }
      // Source: design choice (rows are mapped one by one, so the thread count cannot change a byte)
      expect(files['m3.json']).toBe(files['m1.json']);
      expect(outs[1]).toBe(outs[0]);
      expect(errs[1]).toBe(errs[0]);
      expect(errs[0]).toMatch(/lay outside the source range/);
      expect(outs[0].split('\n').length).toBe(4002);
    }
    // The threads did the work: two files read per fit and one file mapped per apply, for both methods.
    expect(threadUse.read - before.read).toBe(4);
    expect(threadUse.mapped - before.mapped).toBe(2);
  }, 60_000);

  test('a file the threads cannot read alone (text to map in a late piece) gives the same error as one thread', async () => {
    const files: Record<string, string> = { 's.csv': table(2000), 't.csv': table(2000) };
    await run(['fit', '--method', 'quantile', '--columns', 'a', '--source', 's.csv', '--target', 't.csv', '--out', 'm.json'], files);
    files['x.csv'] = table(3000)
      .replace('\n-0.', '\nnot a number,-0.')
      .replace(/\n[^\n]*$/, '\n');
    const late = table(3000).split('\n');
    late[2900] = 'oops,1,r';
    files['y.csv'] = late.join('\n');
    const before = threadUse.mapped;
    for (const input of ['x.csv', 'y.csv']) {
      const one = await run(['apply', '--model', 'm.json', '--input', input, '--workers', '1'], files);
      const three = await run(['apply', '--model', 'm.json', '--input', input, '--workers', '3'], files);
      // Source: design choice (such files go to the general reader on one thread, which words the error)
      expect(three.code).toBe(one.code);
      expect(three.out).toBe(one.out);
      expect(three.err).toBe(one.err);
      expect(one.code).toBe(1);
    }
    expect(threadUse.mapped).toBe(before);
  }, 60_000);
});
