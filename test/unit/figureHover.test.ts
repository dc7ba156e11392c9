import assert from 'node:assert/strict';
import { budgeted } from '../../extension/core/model/result.js';
import { figureHoverMarkdown } from '../../extension/server/figures.js';

describe('figureHoverMarkdown', () => {
  it('lists the uncertainty budget, one line per term, largest first', () => {
    // Terms in quadrature (GUM, JCGM 100:2008 §5.1.2): √(0.5² + 0.1² + 0.05²) = 0.512 K [computed].
    const r = budgeted(315.2, 'K', 'two windows', [
      { source: 'statistical', value: 0.1, note: 'delta method' },
      { source: 'calibration', value: 0.5, note: 'stage thermometer' },
      { source: 'window', value: 0.05 },
    ]);
    const text = figureHoverMarkdown('tg', r);
    const lines = text.split('\n').filter((l) => l.startsWith('- '));
    assert.deepEqual(lines, ['- calibration: 0\\.5 K (stage thermometer)', '- statistical: 0\\.1 K (delta method)', '- window: 0\\.05 K']);
    assert.match(text, /Uncertainty budget:/);
  });

  it('shows no budget for a figure without one', () => {
    const text = figureHoverMarkdown('tg', budgeted(315.2, 'K', 'hinge', []));
    assert.doesNotMatch(text, /budget/);
  });
});
