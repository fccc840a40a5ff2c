import * as fs from 'fs';
import * as path from 'path';

/** Every .ts file under a folder. */
function tsFiles(dir: string): string[] {
  if (!fs.existsSync(dir)) return [];
  const out: string[] = [];
  for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) out.push(...tsFiles(p));
    else if (/\.(ts|tsx|js)$/.test(e.name)) out.push(p);
  }
  return out;
}

/** Module names a file imports or requires (static and dynamic). */
function importsOf(text: string): string[] {
  const out: string[] = [];
  const re = /(?:import\s[^'"]*?from\s*|import\s*\(\s*|require\s*\(\s*|import\s+|export\s[^'"]*?from\s*)['"]([^'"]+)['"]/g;
  for (let m = re.exec(text); m; m = re.exec(text)) out.push(m[1]);
  return out;
}

const root = path.join(__dirname, '..', '..');
const ADDIN_FOLDERS = ['src/functions', 'src/engine', 'src/input', 'src/fits', 'src/common', 'src/taskpane', 'src/workbook', 'src/plots'];

describe('HyperFormula stays out of the add-in bundle', () => {
  test('no file in the add-in rooms (engine, input, fits, common, functions, taskpane, workbook, plots) imports hyperformula or src/headless', () => {
    // Source: the licence note (HyperFormula is GPL-3.0; only the headless demo and tests use it)
    const offenders: string[] = [];
    let scanned = 0;
    for (const folder of ADDIN_FOLDERS) {
      for (const file of tsFiles(path.join(root, folder))) {
        scanned++;
        for (const mod of importsOf(fs.readFileSync(file, 'utf8'))) {
          if (/^hyperformula(\/|$)/.test(mod) || /(^|\/)headless(\/|$)/.test(mod)) offenders.push(`${path.relative(root, file)} imports ${mod}`);
        }
      }
    }
    expect(scanned).toBeGreaterThan(20);
    expect(offenders).toEqual([]);
  });
  test('the import scanner finds static, re-export, side-effect and dynamic imports (so the check above can fail)', () => {
    // Source: worked example
    const text =
      `import { A } from 'hyperformula';\nimport 'x/registry';\nexport { B } from '../headless/run';\nconst c = ` +
      `require("hyperformula/commonjs");\nconst d = import('y');`;
    expect(importsOf(text)).toEqual(['hyperformula', 'x/registry', '../headless/run', 'hyperformula/commonjs', 'y']);
  });
  test('the webpack entries do not reach src/headless', () => {
    // Source: webpack.config.js entries (functions, taskpane)
    const cfg = fs.readFileSync(path.join(root, 'webpack.config.js'), 'utf8');
    expect(cfg).not.toMatch(/headless|hyperformula/);
  });
});
