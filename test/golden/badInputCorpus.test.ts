import assert from 'node:assert/strict';
import { toJsonReport } from '../../extension/core/index.js';
import { readExpectations } from '../support/expectations.js';
import { loadNotebook } from '../support/loadNotebook.js';

// The bad-input corpus (fixtures/bad): every expectation written into a file must be met by a
// diagnostic with that code on that line, and nothing may fail inside Vitrine.
describe('bad-input corpus', () => {
  const { notebook, texts } = loadNotebook('fixtures/bad');
  const report = toJsonReport(notebook.analyze());

  it('covers every file of the corpus', () => {
    assert.deepEqual(report.files.map((f) => f.path).sort(), [...texts.keys()].sort());
    assert.ok(report.files.length >= 12);
  });

  for (const file of report.files) {
    const all = [...file.diagnostics, ...file.blocks.flatMap((b) => b.diagnostics)];
    const expectations = readExpectations(texts.get(file.path) ?? '');
    describe(file.path, () => {
      it('has expectations', () => assert.ok(expectations.length > 0 || file.path === 'sub/other-file.md'));
      for (const e of expectations) {
        it(`line ${e.line}: ${e.code}`, () => {
          const here = all.filter((d) => d.line === e.line);
          assert.ok(
            here.some((d) => d.code === e.code),
            `expected ${e.code} on line ${e.line}, found: ${here.map((d) => d.code).join(', ') || 'nothing'} (all: ${all.map((d) => `${d.line}:${d.code}`).join(' ')})`,
          );
        });
      }
      it('has no internal errors', () => assert.deepEqual(all.filter((d) => d.code === 'internal.error'), []));
    });
  }

  it('refuses a data file larger than the limit, with the sizes in the message', () => {
    const { notebook: small } = loadNotebook('fixtures/bad', { maxDataFileBytes: 10 });
    const r = toJsonReport(small.analyze(['paths.md']));
    const d = r.files[0].blocks.flatMap((b) => b.diagnostics).find((x) => x.code === 'data.too-large');
    assert.ok(d, 'a data.too-large diagnostic');
    assert.match(d.message, /data\/bad-cells\.csv/);
  });
});
