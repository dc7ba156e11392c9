import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import * as path from 'node:path';
// @ts-expect-error -- a plain script of the repository, without types
import { compiledValidatorsSource, OUTPUT } from '../../scripts/compile-schemas.mjs';
import { REPO } from '../support/loadNotebook.js';

describe('validators compiled from the schemas', () => {
  it('are the ones the schemas give today (run `npm run schemas` after changing a schema)', () => {
    const committed = readFileSync(path.join(REPO, OUTPUT as string), 'utf8');
    assert.ok(committed === (compiledValidatorsSource as () => string)(), `${OUTPUT as string} is out of date: run npm run schemas`);
  });
});
