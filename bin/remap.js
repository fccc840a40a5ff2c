#!/usr/bin/env node
'use strict';
// The `remap` command. Runs the compiled command in dist-cli/ (`npm run build:cli`), so an install without
// development dependencies works; in a development checkout without that build, it runs the TypeScript
// sources directly through tsx, so the command and the add-in always run the same engine code.
const fs = require('fs');
const path = require('path');

function loadMain() {
  const compiled = path.join(__dirname, '..', 'dist-cli', 'cli', 'main.js');
  if (fs.existsSync(compiled)) return require(compiled).main;
  try {
    require('tsx/cjs/api').register();
  } catch {
    process.stderr.write('remap: the command is not built; run `npm run build:cli` (needs the development dependencies) and try again.\n');
    process.exit(1);
  }
  return require('../src/cli/main.ts').main;
}

loadMain()(process.argv.slice(2), {
  stdout: (s) => process.stdout.write(s),
  stderr: (s) => process.stderr.write(s),
  readFile: (p) => fs.readFileSync(p, 'utf8'),
  writeFile: (p, t) => fs.writeFileSync(p, t),
}).then(
  (code) => {
    process.exitCode = code;
  },
  (e) => {
    process.stderr.write(`remap: unexpected problem: ${e && e.message ? e.message : String(e)}\n`);
    process.exitCode = 1;
  },
);
