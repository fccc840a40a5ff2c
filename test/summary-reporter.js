/* Prints one closing line, "tests: N passed, N failed", after jest's own summary. */
class SummaryReporter {
  onRunComplete(_contexts, results) {
    const skipped = results.numPendingTests + results.numTodoTests;
    const line = `tests: ${results.numPassedTests} passed, ${results.numFailedTests} failed` + (skipped ? `, ${skipped} skipped` : '');
    process.stdout.write(`\n${line}\n`);
  }
}
module.exports = SummaryReporter;
