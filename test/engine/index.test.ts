import * as fs from 'fs';
import * as path from 'path';
import * as engine from '../../src/engine';

const root = path.join(__dirname, '..', '..', 'src', 'engine');

function sourceFiles(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = path.join(dir, e.name);
    return e.isDirectory() ? sourceFiles(p) : e.name.endsWith('.ts') ? [p] : [];
  });
}

describe('the engine is pure', () => {
  const files = sourceFiles(root);

  test('no engine file imports Node built-ins, Office, the DOM layer or the layers above it', () => {
    // Source: DEVELOPERS.md, "Conventions": the engine is pure numbers: no Office, no DOM, no Node-only APIs
    const forbidden =
      /from '(fs|path|os|child_process|worker_threads|node:[a-z_]+|\.\.\/\.\.\/(functions|cli|taskpane|workbook|headless)[^']*|\.\.\/(functions|cli|taskpane|workbook|headless)[^']*)'/;
    const offenders = files.filter((f) => forbidden.test(fs.readFileSync(f, 'utf8')));
    expect(offenders.map((f) => path.relative(root, f))).toEqual([]);
  });

  test('no engine file touches Office, document, window or process', () => {
    const touches = /\b(Office\.|Excel\.|document\.|window\.|process\.)/;
    const offenders = files.filter((f) => touches.test(fs.readFileSync(f, 'utf8').replace(/\/\*[\s\S]*?\*\/|\/\/.*$/gm, '')));
    expect(offenders.map((f) => path.relative(root, f))).toEqual([]);
  });

  test('importing the engine registers the methods in menu order', () => {
    const names = engine.listMethods().map((m) => m.name);
    expect(names.slice(0, 5)).toEqual(['quantile', 'step', 'ordinal', 'linear', 'pairs']);
  });
});
