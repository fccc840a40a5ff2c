#!/usr/bin/env node
'use strict';
// The `remap` command. Runs the TypeScript sources directly (tsx), so the
// command and the add-in always run the same engine code.
require('tsx/cjs/api').register();
const fs = require('fs');
const { main } = require('../src/cli/main.ts');

main(process.argv.slice(2), {
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
