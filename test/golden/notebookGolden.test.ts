import assert from 'node:assert/strict';
import * as fs from 'node:fs';
import * as path from 'node:path';
import { toJsonReport } from '../../extension/core/index.js';
import { loadNotebook, REPO } from '../support/loadNotebook.js';

// Golden results: the full `analyze --json` document of each fixture notebook, reviewed as a
// diff whenever it changes. Regenerate with UPDATE=1 npm test.
const NOTEBOOKS = ['fixtures/demo', 'fixtures/bad'];

describe('golden results', () => {
  for (const folder of NOTEBOOKS) {
    it(folder, () => {
      const { notebook } = loadNotebook(folder);
      const actual = JSON.stringify(toJsonReport(notebook.analyze()), null, 2) + '\n';
      const file = path.join(REPO, 'test', 'golden', `${path.basename(folder)}.golden.json`);
      if (process.env.UPDATE === '1' || !fs.existsSync(file)) {
        fs.writeFileSync(file, actual);
        if (process.env.UPDATE !== '1') assert.fail(`wrote new golden file ${file}; review it and run again`);
        return;
      }
      assert.equal(actual, fs.readFileSync(file, 'utf8'));
    });
  }
});
