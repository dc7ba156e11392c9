/**
 * Every user-facing diagnostic message, in one module. Each builder returns a stable code, a
 * default severity and a sentence that says what is wrong and what to do. Tests assert against
 * these builders, not against copied strings.
 */
import type { DiagnosticCode } from './codes.js';
import type { Message, Severity } from './diagnostic.js';

function msg(code: DiagnosticCode, severity: Severity, message: string, phase?: 'save'): Message {
  return phase ? { code, severity, message, phase } : { code, severity, message };
}

function fmt(value: number, digits = 4): string {
  if (!Number.isFinite(value)) return String(value);
  const abs = Math.abs(value);
  if (abs !== 0 && (abs < 1e-3 || abs >= 1e6)) return value.toExponential(digits - 1);
  return String(Number(value.toPrecision(digits)));
}

/** A material's relaxation block that gives no VFT law: its id, and whether its data table had errors. */
export interface RelaxationState {
  readonly id: string;
  readonly tableErrors: boolean;
}

/** Why a relaxation block gives no VFT law, in words: never "no relaxation data" when there is a block. */
function relaxationStateText(r: RelaxationState): string {
  return r.tableErrors
    ? `the errors in the data table of relaxation block ${r.id} prevent its VFT fit (fix them there)`
    : `relaxation block ${r.id} gives no VFT fit (see its diagnostics)`;
}

export const messages = {
  // Blocks and fences
  blockUnclosed: (kind: string) =>
    msg('block.unclosed', 'warning', `This ${kind} block has no closing fence, so it runs to the end of its container. Add a closing fence.`),
  blockEmpty: (kind: string) => msg('block.empty', 'error', `This ${kind} block is empty. Write its metadata as "key: value" lines.`),
  blockBadId: (id: string) =>
    msg('block.bad-id', 'error', `"${id}" is not a valid id. Use letters, digits and . _ - : (starting with a letter or digit).`),
  blockNoId: (kind: string) =>
    msg('block.no-id', 'warning', `This ${kind} block has no id, so nothing can refer to it. Write an id after the kind, e.g. "${kind} ${kind === 'material' ? 'M-1' : 'D-1'}".`),
  blockExtraInfo: (text: string) =>
    msg('block.extra-info', 'warning', `Text after the id is ignored: "${text}". The info string is the block kind and one id.`),
  blockKindTypo: (written: string, kind: string) =>
    msg('block.kind-typo', 'info', `"${written}" is not a block kind, so this block is ordinary markdown and is not analysed. Did you mean "${kind}"? Block kinds are written in lower case and singular.`),
  duplicateId: (id: string, where: string) => msg('block.duplicate-id', 'error', `The id "${id}" is already used at ${where}. Ids must be unique across the notebook.`),

  // YAML
  yamlSyntax: (detail: string) => msg('yaml.syntax', 'error', `The metadata is not valid YAML: ${detail}`),
  yamlNotMap: () => msg('yaml.not-a-map', 'error', 'The metadata must be a list of "key: value" lines.'),
  yamlTooDeep: (limit: number) =>
    msg('yaml.too-deep', 'error', `The metadata is nested too deeply (more than ${limit} levels of maps and lists); Vitrine reads none of it. Flatten it.`),

  // Schema
  missingRequired: (key: string, kind: string, hint: string) =>
    msg('meta.missing-required', 'error', `The ${kind} block needs "${key}"${hint ? ` (${hint})` : ''}.`),
  missingRecommended: (key: string, kind: string, why: string) =>
    msg('meta.missing-recommended', 'warning', `The ${kind} block should record "${key}": ${why}.`, 'save'),
  missingOneOf: (keys: readonly string[], kind: string) =>
    msg('meta.missing-required', 'error', `The ${kind} block needs ${keys.map((k) => `"${k}"`).join(' or ')}.`),
  unknownKey: (key: string, kind: string, suggestion: string | null) =>
    msg('meta.unknown-key', 'warning', `"${key}" is not a ${kind} key${suggestion ? `; did you mean "${suggestion}"?` : '.'} It is ignored.`),
  wrongType: (key: string, expected: string) => msg('meta.wrong-type', 'error', `"${key}" must be ${expected}.`),
  badValue: (key: string, allowed: readonly string[]) =>
    msg('meta.bad-value', 'error', `"${key}" must be one of ${allowed.map((a) => `"${a}"`).join(', ')}.`),
  badPattern: (key: string, what: string) => msg('meta.bad-value', 'error', `"${key}" must be ${what}.`),
  outOfRange: (key: string, limit: string) => msg('meta.out-of-range', 'error', `"${key}" must be ${limit}.`),
  schemaOther: (key: string, detail: string) => msg('meta.invalid', 'error', `"${key}" is not valid: ${detail}.`),

  // Quantities
  quantityNotNumber: (key: string, words: string, example: string) =>
    msg('quantity.not-a-number', 'error', `"${key}" must be ${words} with a unit, e.g. "${example}".`),
  quantityAmbiguousComma: (key: string, text: string) =>
    msg('quantity.ambiguous-comma', 'error', `"${key}: ${text}": the comma may be a decimal comma or a thousands separator. Write the number with a decimal point and no separator (e.g. 1.25 or 1250).`),
  /** A clock `a:b` that does not say whether it is hours and minutes or minutes and seconds. */
  quantityAmbiguousClock: (key: string, text: string, first: number, second: number) => {
    const n = (x: number): string => String(Number(x.toPrecision(12)));
    const two = (x: number): string => (x < 10 ? `0${n(x)}` : n(x));
    const seconds = 60 * first + second;
    const hms = `${two(Math.floor(first / 60))}:${two(first % 60)}:${two(second)}`;
    return msg(
      'quantity.ambiguous-clock',
      'error',
      `"${key}: ${text}" may be ${n(first)} h ${n(second)} min or ${n(first)} min ${n(second)} s, 60 times apart. Write "${n(first)} h ${n(second)} min", or "${hms}" or "${n(seconds)} s"; or name the first part: "${n(first)}:${two(second)} h" (hours and minutes) or "${n(first)}:${two(second)} min" (minutes and seconds). The value is not used.`,
    );
  },
  /** A unit Vitrine does not know; `suggestion` when a near miss of one is. */
  quantityUnknownUnit: (key: string, unit: string, examples: readonly [string, string], suggestion: { unit: string; why: string } | null = null) =>
    msg(
      'quantity.unknown-unit',
      'error',
      suggestion
        ? `"${unit}" in "${key}" is not a unit: ${suggestion.why}. Did you mean "${suggestion.unit}"?`
        : `"${unit}" in "${key}" is not a unit Vitrine knows. Write it like "${examples[0]}" or "${examples[1]}".`,
    ),
  /** A unit of another dimension: names the one needed, two examples, what the unit measures, and a near miss. */
  quantityWrongDimension: (key: string, unit: string, words: string, examples: readonly [string, string], unitWords: string | null = null, suggestion: { unit: string; why: string } | null = null) =>
    msg(
      'quantity.wrong-dimension',
      'error',
      `"${key}" must be ${words}, e.g. "${examples[0]}" or "${examples[1]}"; ${
        suggestion ? `${suggestion.why}. Did you mean "${suggestion.unit}"?` : `"${unit}" is ${unitWords ?? 'not a unit of that'}.`
      } The value is not used.`,
    ),
  quantityTgMultiple: (key: string) =>
    msg('quantity.tg-multiple', 'error', `"${key}" is written as a multiple of Tg, which Vitrine resolves only in a deposition's substrate_temperature. Write the temperature, e.g. "281 K".`),
  quantityTgMultipleForm: (key: string) =>
    msg('quantity.tg-multiple', 'error', `"${key}" as a multiple of Tg is written "0.85 Tg", or "0.85 ± 0.01 Tg" with the uncertainty as a fraction of Tg too.`),
  quantityBound: (key: string, text: string) =>
    msg('quantity.bound', 'error', `"${key}: ${text}" is a bound, not a value; Vitrine needs the value to compute with. Write the value (a bound is read only where one is enough, such as base_pressure).`),
  quantityNotFinite: (key: string) => msg('quantity.not-finite', 'error', `"${key}" must be a finite number.`),
  quantityNotAboveAbsoluteZero: (key: string, kelvin: number) =>
    msg('meta.out-of-range', 'error', `"${key}" is ${fmt(kelvin)} K, at or below absolute zero: an absolute temperature must be above 0 K. Check the value and its unit.`),
  quantityNotAbove: (key: string, words: string, limit: number, unit: string) =>
    msg('meta.out-of-range', 'error', `"${key}" must be ${words} greater than ${limit === 0 ? 'zero' : `${fmt(limit)} ${unit}`}.`),
  quantityBareNumber: (key: string, unit: string) =>
    msg('quantity.bare-number', 'warning', `"${key}" has no unit; Vitrine assumes ${unit}. Write the unit to make it explicit.`),
  temperatureLooksCelsius: (key: string, kelvin: number) =>
    msg('quantity.looks-celsius', 'warning', `"${key}" is ${fmt(kelvin)} K, which is implausibly cold for this material; was it meant in °C?`),

  // Tables and data files
  tableNoData: (kind: string) => msg('table.no-data', 'error', `The ${kind} block needs data: a "data: file.csv" line or a table after a "---" line.`),
  tableBothData: () => msg('table.both-data', 'error', 'The block has both "data:" and an inline table. Keep one of them.'),
  tableNoHeader: () => msg('table.no-header', 'error', 'The table has no header line. Start it with column names and units, e.g. "T/K, h/nm".'),
  tableNoRows: () => msg('table.no-rows', 'error', 'The table has a header but no data rows.'),
  tableNoUnit: (header: string, words: string, examples: readonly [string, string]) =>
    msg('table.no-unit', 'error', `Column "${header}" has no unit; it needs ${words}, such as "${examples[0]}" or "${examples[1]}" (or the unit on a line under the header).`),
  tableUnknownUnit: (header: string, unit: string, suggestion: { unit: string; why: string } | null = null) =>
    msg('table.unknown-unit', 'error', `Column "${header}": "${unit}" is not a unit Vitrine knows${suggestion ? `: ${suggestion.why}. Did you mean "${suggestion.unit}"?` : '.'}`),
  tableWrongDimension: (header: string, unit: string, words: string, examples: readonly [string, string], suggestion: { unit: string; why: string } | null = null) =>
    msg(
      'table.wrong-dimension',
      'error',
      `Column "${header}" needs ${words}, such as "${examples[0]}" or "${examples[1]}"; ${suggestion ? `${suggestion.why}. Did you mean "${suggestion.unit}"?` : `"${unit}" is not a unit of that.`}`,
    ),
  tableDuplicateColumn: (role: string) => msg('table.duplicate-column', 'error', `Two columns are ${role}. Keep one, or name the one to use in "columns:".`),
  tableMissingColumn: (role: string, kind: string, symbols: string) =>
    msg('table.missing-column', 'error', `The ${kind} table needs a ${role} column (header ${symbols}).`),
  tableColumnsUnknownHeader: (role: string, header: string) =>
    msg('table.unknown-header', 'error', `"columns: ${role}" names "${header}", but the table has no such column.`),
  tableBadCell: (text: string, header: string) =>
    msg('table.bad-cell', 'error', `"${text}" in column "${header}" is not a number; the row is left out until it is.`),
  tableClockCellInUnit: (text: string, header: string, unit: string) =>
    msg(
      'table.bad-cell',
      'error',
      `"${text}" in column "${header}" is a clock time, but the column's unit is ${unit}: write the unit as "t (hh:mm:ss)" (or "t (mm:ss)") for clock times, or write plain numbers in ${unit}.`,
    ),
  tableEmptyCell: (header: string) => msg('table.empty-cell', 'error', `The cell in column "${header}" is empty; the row is left out until it holds a value.`),
  tableNonFinite: (text: string, header: string) =>
    msg('table.non-finite', 'error', `"${text}" in column "${header}" is not a finite number; remove the row or write the value.`),
  tableTemperatureNotPositive: (text: string, header: string, rows: number) =>
    msg(
      'table.temperature-not-positive',
      'error',
      `"${text}" in column "${header}" is at or below absolute zero (0 K)${rows === 2 ? ', and so is 1 more row' : rows > 2 ? `, and so are ${rows - 1} more rows` : ''}; ${rows > 1 ? 'these rows are' : 'this row is'} left out. Check the values and the unit.`,
    ),
  tableTooFewRows: (kind: string, rows: number, needed: number, why: string) =>
    msg('table.too-few-rows', 'error', `The ${kind} table has ${rows} row${rows === 1 ? '' : 's'}; at least ${needed} are needed ${why}. Add rows.`),
  tableRagged: (found: number, expected: number) =>
    msg('table.ragged-row', 'error', `This row has ${found} cells but the header has ${expected}; the row is left out. Write ${expected} values, separated as in the header.`),
  tableInFile: (path: string, count: number) =>
    msg('table.file-errors', 'error', `${path} has ${count} problem${count === 1 ? '' : 's'} in its table; the first is shown with this one.`),

  dataAbsolute: (path: string) => msg('data.absolute-path', 'error', `"${path}" is an absolute path. Write the path relative to this notebook file.`),
  dataOutsideRoot: (path: string) =>
    msg('data.outside-root', 'error', `"${path}" leads outside the notebook folder. Keep data files inside it.`),
  dataMissing: (path: string) => msg('data.missing-file', 'error', `The data file "${path}" does not exist.`),
  dataIsFolder: (path: string) => msg('data.unreadable', 'error', `"${path}" names a folder, not a data file. Name the CSV or TSV file inside it.`),
  dataTooLarge: (path: string, bytes: number, limit: number) =>
    msg('data.too-large', 'error', `The data file "${path}" is ${fmt(bytes / 1e6, 3)} MB, more than the ${fmt(limit / 1e6, 3)} MB Vitrine reads. Split or thin the file.`),
  dataUnreadable: (path: string, detail: string) => msg('data.unreadable', 'error', `The data file "${path}" cannot be read: ${detail}.`),

  // References
  refDangling: (key: string, id: string, kind: string) =>
    msg('ref.dangling', 'error', `"${key}: ${id}" names no block; there is no ${kind} with id "${id}" in this notebook.`),
  refWrongKind: (key: string, id: string, expected: string, actual: string) =>
    msg('ref.wrong-kind', 'error', `"${key}: ${id}" must name a ${expected} block, but "${id}" is a ${actual} block.`),

  // Deposition physics
  tsubAboveTg: (tsub: number, tg: number) =>
    msg('deposition.tsub-above-tg', 'warning', `The substrate (${fmt(tsub)} K) is at or above the material's Tg (${fmt(tg)} K): the film was a liquid while it grew.`),
  tsubRatioOutside: (ratio: number) =>
    msg('deposition.tsub-ratio', 'info', `Tsub/Tg = ${fmt(ratio, 3)} is outside 0.75–0.95, where the most stable glasses form; expect low stability.`),
  pressureHigh: (pa: number) =>
    msg('deposition.pressure-high', 'warning', `Base pressure ${fmt(pa, 3)} Pa is above 1.3e-3 Pa (1e-5 Torr): residual gas may contaminate the film. Check the value and its unit.`),
  pressureImplausible: (pa: number) =>
    msg('deposition.pressure-implausible', 'warning', `Base pressure ${fmt(pa, 3)} Pa is not a plausible vacuum. Check the value and its unit.`),
  thicknessMismatch: (thickness: number, expected: number) =>
    msg('deposition.thickness-mismatch', 'warning', `Thickness ${fmt(thickness)} nm differs from rate × duration = ${fmt(expected)} nm by more than 15 %. Check the rate, the duration or the tooling factor.`),
  rateUnstable: (rel: number) => msg('deposition.rate-unstable', 'warning', `The rate varies by ${fmt(100 * rel, 2)} % (more than 20 %): thickness and stability may vary across the film.`),
  tgReferenceUnknown: (material: string) =>
    msg('deposition.no-tg', 'warning', `Tsub/Tg cannot be computed: material "${material}" has no usable Tg.`),
  tsubFromTg: (factor: number, tg: number, material: string, kelvin: number) =>
    msg('deposition.tsub-from-tg', 'info', `Substrate temperature ${fmt(factor)} Tg = ${fmt(kelvin)} K, from the tg of material "${material}" (${fmt(tg)} K).`),
  /** `missing`: the block names no material; `dangling`: no material has that id; `no-tg`: the material has no usable tg. */
  tsubUnresolved: (factor: number, material: string | null, why: 'missing' | 'dangling' | 'no-tg') =>
    msg(
      'deposition.tsub-unresolved',
      'error',
      `The substrate temperature is written as ${fmt(factor)} Tg, but ${
        why === 'missing' ? 'the block names no material' : why === 'dangling' ? `there is no material "${material ?? ''}"` : `material "${material ?? ''}" has no usable tg`
      }, so it is unknown and nothing is computed from it. Write the tg in the material block, or the temperature in K.`,
    ),
  pressureBoundAboveLimit: (pa: number) =>
    msg('deposition.pressure-high', 'warning', `The base pressure is only known to be below ${fmt(pa, 3)} Pa, which does not show a vacuum better than 1.3e-3 Pa (1e-5 Torr). Record the reading.`),

  // Material
  vftNoTg: (a: number) =>
    msg('material.vft-no-tg', 'error', `With log10_tau0 = ${fmt(a)}, τ never reaches 100 s above T0 (log10_tau0 must be below 2).`),
  vftBadParameters: (detail: string) => msg('material.vft-invalid', 'error', `The VFT parameters are not usable: ${detail}.`),
  vftTgDisagrees: (tgVft: number, tg: number) =>
    msg('material.tg-vft-disagrees', 'warning', `The VFT parameters give Tg = ${fmt(tgVft)} K (τ = 100 s), ${fmt(Math.abs(tgVft - tg), 3)} K from the stated tg ${fmt(tg)} K. Check the parameters or the tg.`),

  // Ramps
  rampNoThickness: () => msg('table.missing-column', 'error', 'The ramp table needs a temperature column (T) and a thickness (h) or specific volume (V) column.'),
  /** One diagnostic for the whole scan, on the first back-step; `count` segments have one. */
  rampMixedDirection: (direction: string, count = 1) =>
    msg(
      'ramp.mixed-direction',
      'error',
      count > 1
        ? `The temperature steps back by more than 0.1 K inside ${count} heating or cooling segments, first in this ${direction} segment: heating and cooling are mixed. Add a time column or split the scan.`
        : `The temperature steps back by more than 0.1 K inside a ${direction} segment: heating and cooling are mixed. Add a time column or split the scan.`,
    ),
  rampRateMismatch: (measured: number, nominal: number) =>
    msg('ramp.rate-mismatch', 'warning', `The measured rate is ${fmt(measured, 3)} K/min, more than 10 % from the stated ${fmt(nominal, 3)} K/min.`),
  rampNoCooling: () => msg('ramp.no-cooling', 'info', 'This ramp has no cooling segment, so no Tg is computed: Tg is taken from cooling only (heating is biased by overshoot).'),
  rampTooFewPoints: (side: string) =>
    msg('ramp.too-few-points', 'error', `The ${side} has fewer than 8 points or less than 10 K of span on one side of the transition; Tg cannot be fitted. Extend the scan.`),
  rampNoTransition: (p: number) =>
    msg('ramp.no-transition', 'warning', `No transition detected in the cooling segment (one straight line fits as well, p = ${fmt(p, 2)}).`),
  rampTgAtEdge: () => msg('ramp.tg-at-edge', 'error', 'The best breakpoint sits at the edge of the allowed range; the scan does not bracket Tg. Extend the temperature range.'),
  rampWeakTransition: (ratio: number) =>
    msg('ramp.weak-transition', 'warning', `The liquid and glass slopes differ little (ratio ${fmt(ratio, 3)} < 1.3): the transition is weak or absent.`),
  rampCurvature: (dw: number) =>
    msg('ramp.curvature', 'warning', `The residuals are strongly correlated (Durbin–Watson ${fmt(dw, 2)} < 1): the data curve away from two straight lines (aging at the low end, evaporation or crystallisation at the high end, or a broad transition). Consider setting windows.`),
  rampTgFar: (tg: number, ref: number, rate: number) =>
    msg('ramp.tg-far-from-reference', 'warning', `Tg = ${fmt(tg)} K at ${fmt(rate, 3)} K/min is more than 10 K from the material's standard Tg (${fmt(ref)} K).`),
  rampFewLinePoints: (line: string, n: number) => msg('ramp.few-points', 'warning', `Only ${n} points define the ${line} line (fewer than 8).`),
  metaPlaceholder: (key: string, example: string | null) =>
    msg('meta.placeholder', 'error', `"${key}" is still a placeholder: write its value in place of "?"${example ? ` (for example "${example}")` : ''}.`),
  rampNoReferenceTemperature: (why: 'no-film' | 'no-substrate-temperature', film: string) =>
    msg(
      'ramp.no-reference-temperature',
      'info',
      why === 'no-film'
        ? 'No density gain: it is evaluated at the film\'s substrate temperature, and the ramp names no film. Write "film: <deposition id>", or "reference_temperature: <T> K".'
        : `No density gain: it is evaluated at the substrate temperature of ${film}, which does not give one. Write its substrate_temperature, or "reference_temperature: <T> K" in this ramp.`,
    ),
  rampNoLcReference: () =>
    msg('ramp.no-lc-reference', 'error', 'No liquid-cooled reference: the ramp needs a cooling segment after the first heating to compute the density gain.'),
  rampSclNotSteeper: () =>
    msg('ramp.scl-not-steeper', 'error', 'The supercooled-liquid line is not steeper than the as-deposited glass line; onset and fictive temperature cannot be placed.'),
  rampTfExtrapolated: (tf: number, tmin: number) =>
    msg('ramp.tf-extrapolated', 'warning', `The fictive temperature ${fmt(tf)} K lies more than 20 K below the lowest measured temperature (${fmt(tmin)} K): the extrapolation dominates its uncertainty.`),
  rampNoOnset: () => msg('ramp.no-onset', 'warning', 'The first heating shows no departure from the as-deposited line: no transformation onset found in this scan.'),
  rampSlopesEqual: (what: string) => msg('ramp.parallel-lines', 'warning', `The two lines for ${what} are not clearly different in slope (t-test, p > 0.05); the intersection is unreliable.`),

  rampDirectionMismatch: (stated: string, found: string) =>
    msg('ramp.direction-mismatch', 'warning', `"direction: ${stated}" but the data show ${found}. Check the metadata or the temperature column.`),
  rampEvaporation: (rate: number) =>
    msg('ramp.evaporation', 'warning', `The thickness falls by ${fmt(rate, 2)} nm/min while held above Tg: the film may be evaporating, which biases the density gain.`),
  rampAbruptDrop: (drop: number) =>
    msg('ramp.abrupt-drop', 'warning', `The thickness drops abruptly by ${fmt(drop, 3)} nm here (crystallisation or dewetting?).`),
  rampDensification: () =>
    msg('ramp.densification-before-onset', 'warning', 'The film densifies before the transformation (it falls below the as-deposited line): typical of low-stability films; the as-deposited line is fitted below this point only.'),
  rampSclShift: (shift: number) =>
    msg('ramp.scl-shift', 'warning', `The supercooled liquid on heating lies ${fmt(shift, 3)} nm from the one on cooling: the film changed between the two (evaporation?), which biases the density gain.`),
  rampTgIntervalAtEdge: (end: 'low' | 'high', edge: number, needed: number) =>
    msg(
      'ramp.tg-at-edge',
      'error',
      `No Tg: the ${end === 'low' ? 'glass' : 'liquid'} line needs at least 8 points and 5 K of span ${end === 'low' ? 'below' : 'above'} the transition region, but the cooling ${end === 'low' ? 'ends' : 'starts'} at ${fmt(edge)} K; the interval of Tg reaches the edge of the data. ${end === 'low' ? 'Cool' : 'Start'} ${end === 'low' ? 'below' : 'above'} ${fmt(needed)} K.`,
    ),
  rampWindowsBend: (glassGap: number, liquidGap: number) =>
    msg('ramp.curvature', 'warning', `A line window still bends with the gaps widened to ${fmt(glassGap, 3)} K below and ${fmt(liquidGap, 3)} K above Tg (aging at the low end, evaporation or crystallisation at the high end?). Tg carries the window term; set windows.glass and windows.liquid on straight parts of the scan.`),
  rampShortGlass: (target: number, used: number) =>
    msg('ramp.short-glass', 'info', `The glass line could not keep 2δ = ${fmt(target, 3)} K from Tg (below that the cooling holds fewer than 8 points or less than 5 K); its gap shrank to ${fmt(used, 3)} K. A glass still relaxing that close to Tg biases Tg upwards and α_h,g beyond the stated uncertainty. Cool further, or record more points below Tg.`),
  rampDuplicateRows: (count: number) =>
    msg('ramp.duplicate-rows', 'warning', `${count} row${count === 1 ? ' repeats' : 's repeat'} an earlier row exactly (first here); ${count === 1 ? 'it is' : 'they are'} left out, since a repeated reading is not a new measurement and would shrink the uncertainty.`),
  rampThicknessNotPositive: (value: number, what: string) =>
    msg('ramp.thickness-not-positive', 'error', `The ${what} ${fmt(value)} is not positive; no figure is computed from this ramp. Check the column and its unit.`),
  rampNoTemperatureChange: () =>
    msg('ramp.no-temperature-change', 'error', 'The temperature does not change in this ramp (all isothermal): there is no heating or cooling to analyse. Use an isotherm block for a hold.'),
  rampEmptyWindow: (name: string, n: number, lo: number, hi: number) =>
    msg('ramp.empty-window', 'error', `windows.${name} [${fmt(lo)} K, ${fmt(hi)} K] holds ${n} point${n === 1 ? '' : 's'} of the scan; a line needs at least 3 (8 recommended). Move the window onto the data.`),
  rampOnsetOutsideData: (onset: number, first: number) =>
    msg('ramp.onset-outside-data', 'warning', `The extrapolated onset (${fmt(onset)} K) lies below the first heating point (${fmt(first)} K): the transformation had begun before the scan started, so no onset is reported. Start the heating lower.`),
  rampDensityGainExtrapolated: (tref: number, lo: number, hi: number) =>
    msg('ramp.density-gain-extrapolated', 'warning', `The density gain would be evaluated at ${fmt(tref)} K, more than 20 K outside the temperatures where both glass lines were measured (${fmt(lo)}–${fmt(hi)} K); a straight-line extrapolation that far is not reported. Set reference_temperature within the data.`),

  // Relaxation
  relaxNoColumns: () =>
    msg('table.missing-column', 'error', 'The relaxation table needs a temperature column (T) and a relaxation-time column (tau or log10_tau), or the loss-peak frequency (f_max or log10_fmax).'),
  relaxUnknownTauDefinition: (written: string) =>
    msg('relaxation.tau-definition', 'error', `tau_definition "${written}" is not one Vitrine can apply to the loss-peak frequencies: write "1/(2 pi f_max)" (the default) or "1/f_max". No fit is made until it says which.`),
  relaxNonPositive: (tau: number) => msg('relaxation.non-positive', 'error', `τ = ${fmt(tau)} s is not positive; this row is left out of the fit.`),
  relaxTooFew: (n: number) => msg('relaxation.too-few-points', 'error', `A VFT fit needs at least 4 points with τ > 0; there are ${n}.`),
  relaxShortRange: (decades: number) =>
    msg('relaxation.short-range', 'warning', `The data span only ${fmt(decades, 2)} decades of τ (fewer than 3): T0 and the fragility are poorly determined.`),
  relaxT0NearData: (t0: number, tmin: number) =>
    msg('relaxation.t0-near-data', 'warning', `T0 = ${fmt(t0)} K is within 5 K of the lowest measured temperature (${fmt(tmin)} K), or not above 0 K: the fit is not constrained.`),
  relaxT0NotPhysical: (t0: number) =>
    msg('relaxation.t0-not-physical', 'warning', `The VFT fit gives T0 = ${fmt(t0)} K, not above 0 K: no physical divergence temperature, so T0, B and log10 τ0 are not reported (the data look Arrhenius-like over their range).`),
  relaxTgExtrapolated: (maxTau: number) =>
    msg('relaxation.tg-extrapolated', 'warning', `The longest τ is ${fmt(maxTau, 3)} s (below 1 s): Tg (τ = 100 s) is extrapolated by more than two decades.`),
  relaxNoFit: () => msg('relaxation.no-fit', 'error', 'The VFT fit did not converge on these data.'),
  relaxFewTemperatures: (n: number) =>
    msg('relaxation.vft-invalid', 'error', `The data hold ${n} distinct temperature${n === 1 ? '' : 's'}; a VFT fit needs at least 3, so no VFT parameters are reported. Measure at more temperatures.`),
  relaxVftBNotPositive: (b: number) =>
    msg('relaxation.vft-invalid', 'error', `The VFT fit is not reported: it gives B = ${fmt(b)} K, but B must be positive (τ falls as the temperature rises). Check the data for a wrong row or unit.`),
  relaxVftT0AboveData: (t0: number, tmin: number) =>
    msg('relaxation.vft-invalid', 'error', `The VFT fit is not reported: it gives T0 = ${fmt(t0)} K, not below the lowest measured temperature (${fmt(tmin)} K), where τ would diverge. Check the data for a wrong row or unit.`),

  // Standard Tg of a material
  fewRates: (n: number) => msg('material.few-rates', 'warning', `Tg at 10 K/min comes from only ${n} cooling rate${n === 1 ? '' : 's'} (fewer than 3); the rate dependence is poorly known.`),
  standardTgExtrapolated: (lo: number, hi: number) =>
    msg('material.tg-extrapolated', 'warning', `10 K/min lies outside the measured cooling rates (${fmt(lo, 3)}–${fmt(hi, 3)} K/min): the standard Tg is extrapolated.`),
  rateSlopeOdd: (slope: number) =>
    msg('material.tg-rate-slope', 'warning', `Tg changes by ${fmt(slope, 3)} K per decade of cooling rate, outside the usual 1–10 K/decade (or negative). Check the rates and the Tg values.`),
  replicatesDisagree: (rate: number, n: number, spread: number, birge: number) =>
    msg('material.tg-replicates-disagree', 'warning', `The ${n} ramps at ${fmt(rate, 3)} K/min disagree: their Tg values span ${fmt(spread, 3)} K, ${fmt(birge, 3)} times what their uncertainties allow (Birge ratio). The standard Tg carries their scatter; check the films and the ramps.`),
  fragilityConversion: (q: number) =>
    msg('material.fragility-conversion', 'warning', `Only one cooling rate (${fmt(q, 3)} K/min): the standard Tg is a fragility-based conversion, Tg + (Tg/m)·log10(10 K/min / q).`),
  noFragilityForConversion: (relaxation?: RelaxationState) =>
    msg(
      'material.no-fragility',
      'info',
      `The films were cooled at one rate other than 10 K/min and the material has no fragility (${relaxation ? `no VFT parameters, and ${relaxationStateText(relaxation)}` : 'no VFT parameters or relaxation data'}), so no standard Tg is computed.`,
    ),
  standardTgDisagrees: (computed: number, stated: number) =>
    msg('material.standard-tg-disagrees', 'warning', `The cooling ramps give Tg(10 K/min) = ${fmt(computed)} K, ${fmt(Math.abs(computed - stated), 2)} K from the stated tg ${fmt(stated)} K.`),

  // Isotherms
  isoNoColumns: () => msg('table.missing-column', 'error', 'The isotherm table needs a time column (t) and a thickness column (h).'),
  isoNoFit: () => msg('isotherm.no-fit', 'error', 'The plateau–transformation–plateau fit failed on these data (at least 8 points are needed).'),
  isoDrift: (dev: number) => msg('isotherm.temperature-drift', 'error', `The temperature departs from the hold by ${fmt(dev, 2)} K (more than 0.3 K) after it was reached.`),
  isoNoFinalPlateau: () =>
    msg('isotherm.no-final-plateau', 'warning', 'No final plateau: the transformation had not finished when the data end, so the transformation time is a lower bound.'),
  isoTransformedDuringRamp: () =>
    msg('isotherm.transformed-during-ramp', 'warning', 'The transformation began before the hold temperature was reached: part of it happened during the ramp.'),
  isoEvaporation: () => msg('isotherm.evaporation', 'warning', 'The thickness falls after the final plateau is reached (evaporation?): the final plateau slope was fitted, not assumed flat.'),
  isoAbruptDrop: (drop: number) => msg('isotherm.abrupt-drop', 'warning', `The thickness drops abruptly by ${fmt(drop, 3)} nm here (crystallisation?).`),
  isoSigmoidal: (dw: number) =>
    msg('isotherm.sigmoidal', 'warning', `The transformation is not linear in time (Durbin–Watson ${fmt(dw, 2)} < 1 over it): a bulk or nucleation mechanism rather than a growth front, so the front velocity is not defined.`),
  isoNoTransformation: () => msg('isotherm.no-transformation', 'warning', 'The thickness does not change between the plateaus: no transformation found.'),
  isoNoVft: (material: string, relaxation?: RelaxationState) =>
    msg(
      'isotherm.no-vft',
      'info',
      relaxation
        ? `No τα: material "${material}" has no VFT parameters, and ${relaxationStateText(relaxation)}; so no stability ratio is computed.`
        : `No τα: material "${material}" has neither VFT parameters nor relaxation data, so no stability ratio is computed.`,
    ),
  isoTauExtrapolated: (T: number, lo: number, hi: number) =>
    msg('isotherm.tau-extrapolated', 'warning', `τα at ${fmt(T)} K comes from extrapolating the VFT fit outside its data (${fmt(lo)}–${fmt(hi)} K).`),

  // Calorimetry
  dscNoColumns: (what: string) => msg('table.missing-column', 'error', `The dsc table needs a temperature column (T) and a ${what} column.`),
  dscNoMass: () => msg('dsc.no-mass', 'error', 'Heat flow needs the sample mass and the rate to give a heat capacity; write "mass:".'),
  dscWindowOverlap: (which: string) =>
    msg('dsc.window-overlap', 'error', `The ${which} baseline window reaches into the transition (the steepest rise lies inside it). Set windows.${which} away from the step.`),
  dscTooFew: (which: string) => msg('dsc.too-few-points', 'error', `The ${which} baseline window holds fewer than 3 points.`),
  dscNoStep: (step: number, u: number) =>
    msg('dsc.no-step', 'warning', `No glass-transition step: at the steepest point the baselines differ by ΔCp = ${fmt(step, 2)} ± ${fmt(u, 2)} J/(g·K), within the noise or spread over the whole scan rather than a step between the windows. No onset, midpoint or fictive temperature.`),
  dscInvertedStep: (convention: string | null) =>
    msg('dsc.inverted-step', 'error', `The heat capacity falls at the glass transition: the step looks inverted for ${convention ?? 'heat-capacity data'}. Check \`endotherm:\` (up or down) or the heat-flow column's sign; no figures are given.`),
  dscInconsistent: (detail: string) =>
    msg('dsc.inconsistent', 'error', `The construction contradicts itself (${detail}), so no onset, midpoint or fictive temperature is given. Set windows.glass and windows.liquid on straight parts of the scan.`),
  dscStartupTransient: (from: number, to: number) =>
    msg('dsc.startup-transient', 'warning', `The start of the scan (${fmt(from)} to ${fmt(to)} K) departs from the glass baseline: a start-up transient, left out of the automatic glass window.`),
  dscMassFromPreamble: (text: string, mg: number) =>
    msg('dsc.mass-from-preamble', 'info', `The sample mass is read from the export's preamble (${text}): ${fmt(mg)} mg. Write "mass:" to state it in the block.`),
  dscTfBelowWindow: (tf: number, t1: number) =>
    msg('dsc.tf-below-window', 'error', `The fictive temperature (${fmt(tf)} K) falls below the start of the glass window (${fmt(t1)} K): extend windows.glass to lower temperatures.`),
  dscReferenceMismatch: (what: string) =>
    msg('dsc.reference-mismatch', 'error', `This scan and its reference differ in ${what}; the enthalpy gap needs the same heating rate and sample mass.`),
  dscReferenceSelf: (id: string) =>
    msg('dsc.reference-self', 'error', `"reference: ${id}" names this scan itself; the enthalpy gap needs the liquid-cooled reference scan, a different dsc block.`),
  dscReferenceNoData: (id: string) => msg('dsc.reference-no-data', 'warning', `The reference scan "${id}" has no usable heat capacity data.`),
  dscPeaks: (kind: string) => msg('dsc.peaks', 'warning', `An ${kind} peak appears in the liquid region (crystallisation or melting?): the liquid baseline may be wrong.`),
  dscCpBelowReference: () =>
    msg('dsc.cp-below-reference', 'warning', 'In the glass region the heat capacity lies below that of the reference scan (reported for stable glasses); each scan uses its own glass baseline.'),

  // Equivalent aging
  agingExtrapolated: () =>
    msg('aging.extrapolated', 'info', 'The equivalent aging time is an extrapolation far below Tg; estimates from different methods disagree, so it is given as a bracket.'),

  // Plausibility against published ranges (warnings, never fit targets)
  resultNotFinite: (name: string, value: number) =>
    msg('result.not-finite', 'warning', `${name} is not reported: it came out as ${fmt(value)}, not a finite number (the inputs are too large, too small or out of the method's domain). Check the values and their units.`),
  implausible: (name: string, value: string, range: string, source: string) =>
    msg('result.implausible', 'warning', `${name} = ${value} is outside the usual ${range} (${source}). Check the data and the windows.`),

  // Results blocks
  resultsStale: (id: string) =>
    msg('results.stale', 'warning', `These recorded figures no longer match the inputs of "${id}": its data or metadata changed since they were written (or the record was written by hand). Refresh them with the quick fix, which writes the figures and their inputs hash.`),

  // Host
  fileUnreadable: (detail: string) => msg('file.unreadable', 'error', `The notebook file cannot be read: ${detail}.`),
  fileTooLarge: (bytes: number, limit: number) =>
    msg('file.too-large', 'error', `The notebook file is ${fmt(bytes / 1e6, 3)} MB, more than the ${fmt(limit / 1048576, 3)} MiB Vitrine reads; it was not read. Split it into several files.`),
  internalError: (detail: string) => msg('internal.error', 'error', `Vitrine failed on this block (${detail}). The rest of the notebook was still analysed; please report this.`),
};

export { fmt as formatNumber };
