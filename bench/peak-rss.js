'use strict';
// Preloaded by bench/cli.bench.ts into each `remap` process: prints the peak resident memory (KB) and the CPU time of all
// its threads (ms) on exit. Linux's VmHWM is
// this process's own peak; maxRSS can carry the peak of the process that started it (fork keeps it across exec).
const fs = require('fs');
process.on('exit', () => {
  let kb = process.resourceUsage().maxRSS;
  try {
    const m = /VmHWM:\s*(\d+) kB/.exec(fs.readFileSync('/proc/self/status', 'utf8'));
    if (m) kb = Number(m[1]);
  } catch {
    // not Linux: maxRSS it is
  }
  const cpu = process.cpuUsage();
  process.stderr.write(`peak-rss ${kb}\ncpu-ms ${Math.round((cpu.user + cpu.system) / 1000)}\n`);
});
