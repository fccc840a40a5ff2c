'use strict';
// Preloaded by bench/cli.bench.ts into each `remap` process: prints the peak resident memory (KB) on exit.
process.on('exit', () => process.stderr.write(`peak-rss ${process.resourceUsage().maxRSS}\n`));
