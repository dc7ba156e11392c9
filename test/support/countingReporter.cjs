// Mocha's spec reporter, closing with the plain line CI reads: "N passed, N failed".
'use strict';
const Mocha = require('mocha');

class CountingReporter extends Mocha.reporters.Spec {
  constructor(runner, options) {
    super(runner, options);
    runner.once('end', () => {
      const s = runner.stats || { passes: 0, failures: 0, pending: 0 };
      const skipped = s.pending ? `, ${s.pending} skipped` : '';
      process.stdout.write(`\n${s.passes} passed, ${s.failures} failed${skipped}\n`);
    });
  }
}

module.exports = CountingReporter;
