import * as fs from 'fs';
import * as path from 'path';

/**
 * Follows the static imports (not `import type`, not dynamic `import()`) of a
 * source file through the project's own modules, and lists the packages reached.
 */
function staticPackages(entry: string): Set<string> {
  const seen = new Set<string>();
  const packages = new Set<string>();
  const visit = (file: string): void => {
    if (seen.has(file)) return;
    seen.add(file);
    const text = fs.readFileSync(file, 'utf8');
    for (const m of text.matchAll(/^import\s+(?!type\b)(?:[^'";]*?\sfrom\s+)?['"]([^'"]+)['"]/gm)) {
      const spec = m[1];
      if (spec.startsWith('.')) visit(path.resolve(path.dirname(file), spec) + '.ts');
      else packages.add(spec);
    }
    for (const m of text.matchAll(/^export\s+(?!type\b)[^'";]*?\sfrom\s+['"]([^'"]+)['"]/gm)) {
      if (m[1].startsWith('.')) visit(path.resolve(path.dirname(file), m[1]) + '.ts');
      else packages.add(m[1]);
    }
  };
  visit(entry);
  return packages;
}

const src = path.resolve(__dirname, '../../../src');
const tensorflow = (s: Set<string>) => [...s].filter((p) => p.startsWith('@tensorflow'));

describe('TensorFlow.js is loaded only when a gradient-net fit trains', () => {
  test('the engine (every method, map JSON, the gradient-net map and its backend options) imports no TensorFlow.js package statically', () => {
    // Source: design choice -- the worksheet bundle must not pull TensorFlow.js until a gradient-net fit starts.
    for (const entry of [
      'engine/index.ts',
      'engine/methods.ts',
      'engine/gradient-net/method.ts',
      'engine/gradient-net/fitted-map.ts',
      'engine/gradient-net/backend.ts',
    ]) {
      expect({ entry, packages: tensorflow(staticPackages(path.join(src, entry))) }).toEqual({ entry, packages: [] });
    }
  });

  test('the trainer imports only tfjs-core and the cpu and wasm backends, never the umbrella package', () => {
    const packages = tensorflow(staticPackages(path.join(src, 'engine/gradient-net/train.ts'))).sort();
    expect(packages).toEqual(['@tensorflow/tfjs-backend-cpu', '@tensorflow/tfjs-backend-wasm', '@tensorflow/tfjs-core']);
    expect(fs.readFileSync(path.join(src, 'engine/gradient-net/method.ts'), 'utf8')).toMatch(/await import\('\.\/train'\)/);
  });
});
