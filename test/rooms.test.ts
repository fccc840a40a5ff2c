import * as fs from 'fs';
import * as path from 'path';

/**
 * The rooms of src/ and which rooms each may import (DEVELOPERS.md, "Layout").
 * Design choice: each layer imports only downward, engine <- input <- fits <-
 * the doors (functions, cli, taskpane, headless); workbook is Office's side,
 * used by the Excel doors; plots are pure drawing on top of the engine.
 */
const ALLOWED: Record<string, readonly string[]> = {
  engine: [],
  input: ['engine'],
  fits: ['engine', 'input'],
  common: [],
  plots: ['engine', 'common'],
  workbook: ['engine', 'input', 'fits', 'common'],
  functions: ['engine', 'input', 'fits', 'workbook'],
  cli: ['engine', 'input', 'fits'],
  taskpane: ['engine', 'input', 'fits', 'workbook', 'plots', 'common'],
  headless: ['engine', 'input', 'fits', 'functions', 'plots', 'common'],
  help: [],
};

const root = path.join(__dirname, '..');
const src = path.join(root, 'src');

function filesUnder(dir: string): string[] {
  const out: string[] = [];
  for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) out.push(...filesUnder(p));
    else if (/\.(ts|js)$/.test(e.name)) out.push(p);
  }
  return out;
}

/** Relative module names a file imports, re-exports or requires (static and dynamic). */
function relativeImports(text: string): string[] {
  const out: string[] = [];
  const re = /(?:import\s[^'"]*?from\s*|import\s*\(\s*|require\s*\(\s*|import\s+|export\s[^'"]*?from\s*)['"](\.{1,2}\/[^'"]*)['"]/g;
  for (let m = re.exec(text); m; m = re.exec(text)) out.push(m[1]);
  return out;
}

/** The room (first folder under src/) a path lies in, or null outside src/. */
function roomOf(file: string): string | null {
  const rel = path.relative(src, file);
  if (rel.startsWith('..')) return null;
  return rel.split(path.sep)[0];
}

describe('rooms import only downward', () => {
  test('the import reader finds static, dynamic, re-exported and required relative modules', () => {
    // Source: design choice (the forms of import the code base uses)
    const text =
      "import a from '../engine/x';\nimport type { B } from \"./b\";\nexport { c } from '../fits';\nconst d = require('../input/cells');\nconst e " +
      "= import('./lazy');\nimport 'x';";
    expect(relativeImports(text)).toEqual(['../engine/x', './b', '../fits', '../input/cells', './lazy']);
  });

  test('every folder under src/ is a known room', () => {
    // Source: design choice (a new room is declared above and in DEVELOPERS.md)
    const rooms = fs
      .readdirSync(src, { withFileTypes: true })
      .filter((e) => e.isDirectory())
      .map((e) => e.name);
    expect(rooms.filter((r) => !(r in ALLOWED))).toEqual([]);
  });

  test('no file imports a room its layer may not use', () => {
    // Source: design choice (the layering written in DEVELOPERS.md)
    const offenders: string[] = [];
    let checked = 0;
    for (const file of filesUnder(src)) {
      const from = roomOf(file);
      if (!from) continue;
      for (const mod of relativeImports(fs.readFileSync(file, 'utf8'))) {
        const to = roomOf(path.resolve(path.dirname(file), mod));
        checked++;
        if (to === null) offenders.push(`${path.relative(root, file)} imports ${mod}, outside src/`);
        else if (to !== from && !(ALLOWED[from] ?? []).includes(to)) offenders.push(`${path.relative(root, file)} (${from}) imports ${mod} (${to})`);
      }
    }
    expect(checked).toBeGreaterThan(100);
    expect(offenders).toEqual([]);
  });
});
