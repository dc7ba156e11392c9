import assert from 'node:assert/strict';
import { ESLint } from 'eslint';
import { REPO } from '../support/loadNotebook.js';

// The lint rule that keeps extension/core free of vscode, fs and Node built-ins must fire.
describe('core purity lint rule', () => {
  const eslint = new ESLint({ cwd: REPO });
  const lint = async (code: string, file: string) => (await eslint.lintText(code, { filePath: `${REPO}/${file}` }))[0].messages.filter((m) => m.ruleId === 'no-restricted-imports');

  it('rejects fs, node:path and vscode in the core', async () => {
    assert.equal((await lint("import * as fs from 'fs';\nexport const a = fs;\n", 'extension/core/x.ts')).length, 1);
    assert.equal((await lint("import * as p from 'node:path';\nexport const a = p;\n", 'extension/core/x.ts')).length, 1);
    assert.equal((await lint("import * as v from 'vscode';\nexport const a = v;\n", 'extension/core/x.ts')).length, 1);
  });

  it('allows them in the CLI', async () => {
    assert.equal((await lint("import * as fs from 'node:fs';\nexport const a = fs;\n", 'extension/cli/x.ts')).length, 0);
  });
});

describe('core layer lint rule', () => {
  const eslint = new ESLint({ cwd: REPO });
  const lint = async (code: string, file: string) => (await eslint.lintText(code, { filePath: `${REPO}/${file}` }))[0].messages.filter((m) => m.ruleId === 'no-restricted-imports');

  it('rejects an import from a higher layer', async () => {
    assert.equal((await lint("import { Notebook } from '../engine/notebook.js';\nexport const a = Notebook;\n", 'extension/core/analysis/x.ts')).length, 1);
    assert.equal((await lint("import { parseTable } from '../parse/table.js';\nexport const a = parseTable;\n", 'extension/core/model/x.ts')).length, 1);
    assert.equal((await lint("import { fitLine } from '../numeric/lineFit.js';\nexport const a = fitLine;\n", 'extension/core/text/x.ts')).length, 1, 'same rank');
  });

  it('allows an import from a lower layer and within a folder', async () => {
    assert.equal((await lint("import { parseTable } from '../parse/table.js';\nexport const a = parseTable;\n", 'extension/core/block/x.ts')).length, 0);
    assert.equal((await lint("import { analyzeRamp } from './rampAnalysis.js';\nexport const a = analyzeRamp;\n", 'extension/core/analysis/x.ts')).length, 0);
  });
});
