#!/usr/bin/env node
'use strict';
// The `remap` command. Runs the compiled command (build/cli, made by `npm run build:cli`, part of
// `npm run build`). In a development checkout whose sources are newer than that build, or where
// there is no build, it runs the TypeScript sources through tsx instead, so the command always
// runs the engine the checkout holds.
const fs = require('fs');
const path = require('path');
const Module = require('module');

const root = path.resolve(__dirname, '..');
const compiled = path.join(root, 'build', 'cli', 'cli', 'main.js');
const sources = ['cli', 'engine', 'input', 'fits', 'common'].map((d) => path.join(root, 'src', d));

/** Newest modification time (ms) of the .ts files under the folders, or 0 when there are none. */
function newestSource() {
  let newest = 0;
  const walk = (dir) => {
    let entries;
    try {
      entries = fs.readdirSync(dir, { withFileTypes: true });
    } catch {
      return;
    }
    for (const e of entries) {
      const p = path.join(dir, e.name);
      if (e.isDirectory()) walk(p);
      else if (e.name.endsWith('.ts')) newest = Math.max(newest, fs.statSync(p).mtimeMs);
    }
  };
  sources.forEach(walk);
  return newest;
}

function useCompiled() {
  let built;
  try {
    built = fs.statSync(compiled).mtimeMs;
  } catch {
    return false;
  }
  return newestSource() <= built;
}

// TensorFlow.js takes about 0.2 s to load and only gradient-net fits use it: load it when first used.
// tsc compiles `import * as tf` to a require whose result is read property by property at call time,
// so a stand-in that loads the real module on the first property read behaves the same.
const LAZY = new Set(['@tensorflow/tfjs', '@tensorflow/tfjs-backend-wasm', '@tensorflow/tfjs-core']);
const load = Module._load;
Module._load = function (request, parent, isMain) {
  if (!LAZY.has(request)) return load.call(this, request, parent, isMain);
  let real = null;
  const get = () => (real === null ? (real = load.call(Module, request, parent, isMain)) : real);
  return new Proxy(
    {},
    {
      get: (_, key) => (key === '__esModule' ? true : Reflect.get(get(), key)),
      has: (_, key) => key in get(),
      ownKeys: () => Reflect.ownKeys(get()),
      getOwnPropertyDescriptor: (_, key) => {
        const d = Reflect.getOwnPropertyDescriptor(get(), key);
        return d ? { ...d, configurable: true } : undefined;
      },
    },
  );
};

let main;
if (useCompiled()) main = require(compiled).main;
else {
  try {
    require('tsx/cjs/api').register();
  } catch {
    process.stderr.write(
      fs.existsSync(compiled)
        ? 'remap: the sources are newer than the compiled command and tsx is not installed; run `npm run build:cli`.\n'
        : 'remap: the command is not compiled and tsx is not installed; run `npm run build:cli` (or `npm ci` for the development tools).\n',
    );
    process.exit(1);
  }
  main = require('../src/cli/main.ts').main;
}

const out = (stream) => (s) => stream.write(s);
main(process.argv.slice(2), {
  stdout: out(process.stdout),
  stderr: out(process.stderr),
  readFile: (p) => fs.readFileSync(p, 'utf8'),
  writeFile: (p, t) => fs.writeFileSync(p, t),
  // Into shared memory: worker threads then read pieces of a large file where it lies, without copies.
  readBytes: (p) => {
    const fd = fs.openSync(p, 'r');
    try {
      const size = fs.fstatSync(fd).size;
      if (size === 0) return fs.readFileSync(p); // a pipe or other stream reports no size
      const bytes = Buffer.from(new SharedArrayBuffer(size));
      let at = 0;
      while (at < size) {
        const got = fs.readSync(fd, bytes, at, size - at, at);
        if (got === 0) break;
        at += got;
      }
      return at === size ? bytes : fs.readFileSync(p);
    } finally {
      fs.closeSync(fd);
    }
  },
  openOut: (p) => {
    if (p === null) return { write: (chunk) => process.stdout.write(chunk), close: () => {} };
    const fd = fs.openSync(p, 'w');
    return {
      write: (chunk) => {
        for (let at = 0; at < chunk.length;) at += fs.writeSync(fd, chunk, at, chunk.length - at);
      },
      close: () => fs.closeSync(fd),
    };
  },
}).then(
  (code) => {
    process.exitCode = code;
  },
  (e) => {
    process.stderr.write(`remap: unexpected problem: ${e && e.message ? e.message : String(e)}\n`);
    process.exitCode = 1;
  },
);
