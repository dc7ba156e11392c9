/**
 * What a table column holds: its role (time, temperature, thickness, …), recognised from the
 * header's symbol, the dimension of the role, and examples of headers for messages.
 *
 * Symbols are matched exactly first (`t` and `T` differ), then as words in any case (`Heat Flow`,
 * `TEMPERATURE`), then by their last words (`Sample Temperature`, `Normalized Heat Flow`).
 */
import { CANONICAL, type Dimension } from './units.js';

export type ColumnRole =
  | 'time'
  | 'temperature'
  | 'thickness'
  | 'volume'
  | 'heat_capacity'
  | 'heat_flow'
  | 'specific_heat_flow'
  | 'tau'
  | 'log10_tau'
  | 'f_max'
  | 'log10_fmax';

export const ROLE_DIMENSION: Readonly<Record<ColumnRole, Dimension>> = {
  time: 'time',
  temperature: 'temperature',
  thickness: 'length',
  volume: 'specific_volume',
  heat_capacity: 'heat_capacity',
  heat_flow: 'heat_flow',
  tau: 'time',
  log10_tau: 'dimensionless',
  specific_heat_flow: 'specific_heat_flow',
  f_max: 'frequency',
  log10_fmax: 'dimensionless',
};

/** Of a log10 column: the dimension of the quantity under the logarithm (its canonical unit is assumed when none is written). */
export const LOG_OF: Partial<Record<ColumnRole, Dimension>> = { log10_tau: 'time', log10_fmax: 'frequency' };

/** A column whose unit fits another dimension takes that role instead (heat flow per mass). */
export const ALTERNATIVE_ROLE: Partial<Record<ColumnRole, ColumnRole>> = { heat_flow: 'specific_heat_flow' };

export const ROLE_SYMBOLS: Readonly<Record<ColumnRole, readonly string[]>> = {
  time: ['t', 'time'],
  temperature: ['T', 'temperature', 'Temp'],
  thickness: ['h', 'd', 'thickness'],
  volume: ['V', 'v', 'volume'],
  heat_capacity: ['Cp', 'cp', 'C_p', 'c_p', 'heat_capacity'],
  heat_flow: ['Phi', 'phi', 'Φ', 'heat_flow', 'HF'],
  tau: ['tau', 'τ', 'tau_alpha', 'relaxation_time'],
  log10_tau: ['log10_tau', 'log10_τ', 'log_tau', 'log_τ', 'logtau', 'lg_tau'],
  specific_heat_flow: [],
  f_max: ['f_max', 'fmax', 'f_peak', 'fpeak', 'nu_max', 'ν_max', 'peak_frequency'],
  log10_fmax: ['log10_fmax', 'log10_f_max', 'log_fmax', 'log_f_max', 'log_f', 'log10_f', 'lg_f', 'lg_fmax', 'log10_f_peak', 'log_f_peak'],
};

const SYMBOL_ROLE = new Map<string, ColumnRole>();
const WORD_ROLE = new Map<string, ColumnRole>();
for (const [role, symbols] of Object.entries(ROLE_SYMBOLS) as Array<[ColumnRole, readonly string[]]>) {
  for (const s of symbols) {
    SYMBOL_ROLE.set(s, role);
    if (s.length >= 3) WORD_ROLE.set(s.toLowerCase(), role);
  }
}

/** Longer symbols are not looked up by their last words (the lookup would cost more than it finds). */
const MAX_WORDS_SYMBOL = 64;

/** Longer symbols name no role (each role's words are short): not lowered or split at all. */
const MAX_SYMBOL = 256;

/** The role of a header symbol, or null. */
export function roleOfSymbol(symbol: string): ColumnRole | null {
  const exact = SYMBOL_ROLE.get(symbol);
  if (exact) return exact;
  if (symbol.length < 3 || symbol.length > MAX_SYMBOL) return null;
  const lower = symbol.toLowerCase().replace(/[\s-]+/g, '_').replace(/[.:]+$/, '');
  const whole = WORD_ROLE.get(lower);
  if (whole || lower.length > MAX_WORDS_SYMBOL || !/\s/.test(symbol.trim())) return whole ?? null;
  // Several words: the longest run of last words that names a role ("Sample Temperature").
  const words = lower.split('_').filter((w) => w.length > 0);
  for (let k = 1; k < words.length; k++) {
    const tail = words.slice(k).join('_');
    const role = tail.length >= 3 ? WORD_ROLE.get(tail) : undefined;
    if (role) return role;
  }
  return null;
}

/** Two units people write for each role, for messages: the canonical one and another. */
const EXAMPLE_UNITS: Readonly<Record<ColumnRole, readonly [string, string]>> = {
  time: ['s', 'min'],
  temperature: ['K', '°C'],
  thickness: ['nm', 'Å'],
  volume: ['cm^3/g', 'mL/g'],
  heat_capacity: ['J/(g*K)', 'J g^-1 K^-1'],
  heat_flow: ['mW', 'W/g'],
  specific_heat_flow: ['W/g', 'mW/mg'],
  tau: ['s', 'ms'],
  log10_tau: ['s', 'ms'],
  f_max: ['Hz', 'kHz'],
  log10_fmax: ['Hz', 'kHz'],
};

/** What a column of this role needs, in words, with two headers written with the column's own symbol. */
export function roleNeeds(role: ColumnRole, symbol: string): { words: string; examples: [string, string] } {
  const [a, b] = EXAMPLE_UNITS[role];
  const inner = LOG_OF[role];
  if (inner) {
    const s = role === 'log10_tau' ? 'tau' : 'f_max';
    return { words: `the decadic logarithm of ${CANONICAL[inner].words}`, examples: [`log10(${s}/${a})`, `log10(${s}/${b})`] };
  }
  const sym = symbol.trim().length > 0 && symbol.length <= 32 ? symbol.trim() : ROLE_SYMBOLS[role][0] ?? role;
  const words = CANONICAL[ROLE_DIMENSION[role]].words;
  const compound = (u: string): boolean => /[/\s*]/.test(u);
  if (/\s/.test(sym)) return { words, examples: [`${sym} (${a})`, `${sym} [${b}]`] };
  return { words, examples: [compound(a) ? `${sym}/(${a})` : `${sym}/${a}`, `${sym} (${b})`] };
}
