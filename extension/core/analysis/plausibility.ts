/**
 * Plausibility of computed figures against published ranges.
 * These are warnings for the user to look again, never targets of a fit.
 */
import { at, type Diagnostic } from '../model/diagnostic.js';
import { formatNumber, messages } from '../model/messages.js';
import type { Results } from '../model/result.js';
import type { Span } from '../text/positions.js';

interface Range {
  readonly result: string;
  readonly label: string;
  readonly lo: number;
  readonly hi: number;
  readonly text: string;
  readonly source: string;
  readonly scale?: number;
}

const RANGES: readonly Range[] = [
  { result: 'alpha_glass', label: 'α (glass)', lo: 0.2e-4, hi: 15e-4, text: '0.2–15 × 10⁻⁴ K⁻¹', source: 'reference methods §2' },
  { result: 'alpha_liquid', label: 'α (liquid)', lo: 0.2e-4, hi: 15e-4, text: '0.2–15 × 10⁻⁴ K⁻¹', source: 'reference methods §2' },
  { result: 'density_gain', label: 'density gain', lo: -10, hi: 2, text: 'range up to about 1.5 % for organic vapor-deposited glasses', source: 'Dalal & Ediger 2012 and later work' },
  { result: 'fragility', label: 'fragility m', lo: 16, hi: 250, text: '16–250', source: 'IUPAC 2013' },
  { result: 'stability_ratio', label: 'stability ratio', lo: 0.1, hi: 1e6, text: '1–10⁵ (liquid-cooled to ultrastable glasses)', source: 'published transformation times' },
  { result: 'front_velocity', label: 'front velocity', lo: 1e-3, hi: 100, text: '0.01–10 nm/s at Tg + 5 to 25 K', source: 'reference methods §4' },
];

export function plausibilityWarnings(results: Results, span: Span): Diagnostic[] {
  const out: Diagnostic[] = [];
  for (const r of RANGES) {
    const v = results[r.result];
    if (!v || (v.value >= r.lo && v.value <= r.hi)) continue;
    out.push(at(messages.implausible(r.label, `${formatNumber(v.value, 3)} ${v.unit === '1' ? '' : v.unit}`.trim(), r.text, r.source), span));
  }
  return out;
}
