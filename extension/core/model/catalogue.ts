/**
 * The catalogue of results: for every result name the analyses emit (DESIGN.md, "Results
 * contract"), how a practitioner labels it, its unit, what it means, the published source of its
 * method and how to display it. Every presenter (CLI table, HTML report,
 * CSV, editor lenses and hovers) reads labels and display hints from here; the formatter that
 * applies them is formatResult.ts.
 *
 * Plain data only. Sources name the publication; where a method is common
 * practice or its own suggestion, the entry says so instead.
 */
import type { BlockKind } from './blockKind.js';

/** `fixed`: 313.8; `exponential`: 3.13e+3 (for figures that span decades). */
export type Notation = 'fixed' | 'exponential';

/** How to print a number: significant digits when there is no uncertainty, and the notation. */
export interface NumberFormat {
  /** Significant digits of a value printed without an uncertainty (with one, the uncertainty sets the place). */
  readonly digits: number;
  readonly notation: Notation;
}

export interface CatalogueEntry extends NumberFormat {
  /** The result's key in `results` (and in the JSON contract). */
  readonly name: string;
  /** The symbol as practitioners write it: `Tg`, `Tf`, `Δρ/ρ`, `T_onset`, `m`. */
  readonly label: string;
  /** The unit of the JSON contract (`1` for a dimensionless number). */
  readonly unit: string;
  /** One line: what the number is. */
  readonly meaning: string;
  /** The published source of the method, or "common practice" where there is none. */
  readonly source: string;
  /** The block kinds whose analysis emits it. */
  readonly kinds: readonly BlockKind[];
  /**
   * Where one name stands for different constructions in different kinds (`tonset`: the onset of
   * the thickness transformation of a ramp, the glass-transition onset of a DSC scan), the label,
   * meaning and source for a kind; `catalogueEntry(name, kind)` applies it.
   */
  readonly byKind?: Partial<Record<BlockKind, { readonly label: string; readonly meaning: string; readonly source: string }>>;
  /** A bracket between methods rather than a measurement: presenters print the interval first. */
  readonly bracket?: boolean;
  /**
   * An absolute (thermodynamic) temperature in K, which presenters also give in °C. Not set on a
   * result in K that is a temperature difference or a parameter (the VFT B).
   */
  readonly absolute?: boolean;
}

const TEMPERATURE = { unit: 'K', digits: 4, notation: 'fixed', absolute: true } as const;

const VFT_SOURCE = 'Böhmer, Ngai, Angell & Plazek, J. Chem. Phys. 99, 4201 (1993) (decadic VFT law and its identities)';
const ISOTHERM_SOURCE = 'Swallen et al., Phys. Rev. Lett. 102, 065503 (2009) (growth front at constant velocity)';
const ONSET_SOURCE = 'ASTM E1356 and ISO 11357-2:2020 (extrapolated onset: tangent at greatest slope meets the glass baseline)';
const DENSITY_SOURCE = 'Dalal & Ediger, J. Phys. Chem. Lett. (2012) (density of vapor-deposited against liquid-cooled glass)';

const ENTRIES = [
  // material and relaxation
  { name: 'tg_vft', label: 'Tg(VFT)', ...TEMPERATURE, kinds: ['material', 'relaxation'], meaning: 'temperature where the VFT relaxation time is 100 s', source: `Angell, Science (1995) (Tg where τ = 100 s); ${VFT_SOURCE}` },
  { name: 'fragility', label: 'm', unit: '1', digits: 3, notation: 'fixed', kinds: ['material', 'relaxation'], meaning: 'kinetic fragility index d log10 τ / d(Tg/T) at Tg', source: `IUPAC, Pure Appl. Chem. 85, 1017 (2013) (definition of m); ${VFT_SOURCE}` },
  { name: 'vft_log10_tau0', label: 'log10 τ0', unit: '1', digits: 4, notation: 'fixed', kinds: ['relaxation'], meaning: 'A of the decadic VFT fit log10 τ = A + B/(T − T0), τ in s', source: VFT_SOURCE },
  { name: 'vft_B', label: 'B', unit: 'K', digits: 4, notation: 'fixed', kinds: ['relaxation'], meaning: 'B of the decadic VFT fit log10 τ = A + B/(T − T0)', source: VFT_SOURCE },
  { name: 'vft_T0', label: 'T0', ...TEMPERATURE, kinds: ['relaxation'], meaning: 'T0 of the decadic VFT fit log10 τ = A + B/(T − T0), where τ diverges', source: VFT_SOURCE },
  { name: 'standard_tg', label: 'Tg(10 K/min)', ...TEMPERATURE, kinds: ['material'], meaning: "Tg at 10 K/min cooling, from the ramps of this material's films at several cooling rates", source: 'Moynihan et al., J. Am. Ceram. Soc. 59, 12 (1976) (dTg/d log q ≈ Tg/m)' },
  // deposition
  { name: 'tsub_over_tg', label: 'Tsub/Tg', unit: '1', digits: 3, notation: 'fixed', kinds: ['deposition'], meaning: "substrate temperature over the material's standard Tg, both in K", source: 'Kearns et al., J. Chem. Phys. 127, 154702 (2007) (stability against Tsub/Tg, greatest near 0.85)' },
  { name: 'expected_thickness', label: 'h(rate × time)', unit: 'nm', digits: 3, notation: 'fixed', kinds: ['deposition'], meaning: 'deposition rate × duration', source: 'common practice, no publication' },
  // ramp
  { name: 'tg', label: 'Tg', ...TEMPERATURE, kinds: ['ramp'], meaning: 'glass transition from the cooling segment: where the glass and liquid lines meet (hinge fit for a sharp transition, two windows for a broad one)', source: 'Muggeo, Stat. Med. (2003) (continuous broken-line regression); Lerman, Appl. Stat. (1980) (profile-likelihood interval); two windows with a gap of 2·Tg/m from dTg/d log q ≈ Tg/m, Moynihan et al., J. Am. Ceram. Soc. 59, 12 (1976)' },
  { name: 'alpha_glass', label: 'α_h,g', unit: '1/K', digits: 3, notation: 'exponential', kinds: ['ramp'], meaning: 'out-of-plane expansion coefficient (1/h)(dh/dT) of the glass line at Tg (supported film, clamped by its substrate; not the bulk volume coefficient)', source: 'definition α = (1/h)·dh/dT; common practice, no publication' },
  { name: 'alpha_liquid', label: 'α_h,l', unit: '1/K', digits: 3, notation: 'exponential', kinds: ['ramp'], meaning: 'out-of-plane expansion coefficient (1/h)(dh/dT) of the supercooled-liquid line at Tg (supported film, clamped by its substrate; not the bulk volume coefficient)', source: 'definition α = (1/h)·dh/dT; common practice, no publication' },
  {
    name: 'tonset',
    label: 'T_onset',
    ...TEMPERATURE,
    kinds: ['ramp', 'dsc'],
    meaning: 'extrapolated onset of transformation on first heating of the as-deposited film',
    source: ONSET_SOURCE,
    byKind: {
      dsc: {
        label: 'T_g,onset',
        meaning: 'extrapolated onset of the glass transition in the heat capacity: the tangent at the inflection meets the glass baseline',
        source: 'ASTM E1356 and ISO 11357-2:2020 (extrapolated onset of the glass transition)',
      },
    },
  },
  { name: 'tonset_deviation', label: 'T_onset,dev', ...TEMPERATURE, kinds: ['ramp'], meaning: 'first of 3 consecutive points more than 3σ from the as-deposited line', source: 'common practice, no publication (noise-sensitive, shown beside the extrapolated onset)' },
  { name: 'tfictive', label: 'Tf', ...TEMPERATURE, kinds: ['ramp', 'dsc'], meaning: 'fictive temperature: as-deposited glass line meets the supercooled-liquid line (ramp), or Moynihan area matching (dsc)', source: 'Moynihan et al., J. Am. Ceram. Soc. 59, 12 (1976) (area matching); Kearns et al., J. Phys. Chem. B (2008) (from thickness)' },
  { name: 'density_gain', label: 'Δρ/ρ', unit: '%', digits: 3, notation: 'fixed', kinds: ['ramp'], meaning: '100 × (h_LC/h_VD − 1) at the reference temperature', source: DENSITY_SOURCE },
  { name: 'reference_temperature', label: 'T_eval', ...TEMPERATURE, kinds: ['ramp'], meaning: "where the density gain is evaluated (default: the film's substrate temperature)", source: DENSITY_SOURCE },
  {
    name: 'equivalent_aging_time',
    label: 't_eq (bracket)',
    unit: 's',
    digits: 2,
    notation: 'exponential',
    kinds: ['ramp', 'dsc'],
    meaning: 'time the liquid-cooled glass would need to age to this Tf: a bracket between two extrapolations (the interval), which can span many decades; the value is only their geometric mean',
    source: 'Berthier & Ediger, J. Chem. Phys. 152, 044501 (2020) (estimates and their disagreement)',
    bracket: true,
  },
  // isotherm
  { name: 'onset_time', label: 't_onset', unit: 's', digits: 4, notation: 'fixed', kinds: ['isotherm'], meaning: 'start of the transformation, from the start of the hold t₀ (the temperature within 0.5 K of the hold)', source: ISOTHERM_SOURCE },
  { name: 'transformation_time', label: 't_trans', unit: 's', digits: 4, notation: 'fixed', kinds: ['isotherm'], meaning: 'end of the transformation, from the start of the hold t₀; a lower bound (the end of the data) when no final plateau is reached', source: ISOTHERM_SOURCE },
  { name: 'front_velocity', label: 'v', unit: 'nm/s', digits: 3, notation: 'fixed', kinds: ['isotherm'], meaning: 'as-deposited thickness over the transformation duration, per front; an upper bound when no final plateau is reached', source: ISOTHERM_SOURCE },
  { name: 'tau_alpha', label: 'τα', unit: 's', digits: 3, notation: 'exponential', kinds: ['isotherm'], meaning: "the material's relaxation time at the hold temperature", source: VFT_SOURCE },
  { name: 'stability_ratio', label: 'S', unit: '1', digits: 3, notation: 'exponential', kinds: ['isotherm'], meaning: 'kinetic stability ratio: transformation time over τα', source: 'Rodríguez-Tinoco et al., review of stable glasses (2022), cited from memory (t_trans/τα)' },
  // dsc
  { name: 'tinflection', label: 'T_infl', ...TEMPERATURE, kinds: ['dsc'], meaning: 'inflection of the glass-transition step: where the second derivative of Cp changes sign, at its steepest rise', source: 'ASTM E1356 (inflection point); Savitzky & Golay, Anal. Chem. 36, 1627 (1964) (local polynomial derivatives)' },
  { name: 'tg_midpoint', label: 'Tg,mid', ...TEMPERATURE, kinds: ['dsc'], meaning: 'half step height between the extrapolated baselines', source: 'ISO 11357-2:2020 (midpoint at half step height)' },
  { name: 'step_height', label: 'ΔCp', unit: 'J/(g*K)', digits: 3, notation: 'fixed', kinds: ['dsc'], meaning: 'heat capacity step between the liquid and glass baselines at the midpoint', source: 'ISO 11357-2:2020 (step height)' },
  { name: 'enthalpy_gap', label: 'ΔH', unit: 'J/g', digits: 3, notation: 'fixed', kinds: ['dsc'], meaning: 'enthalpy of the liquid-cooled glass minus this glass', source: 'Kearns et al., J. Chem. Phys. 127, 154702 (2007); Swallen et al., Science (2007)' },
] as const satisfies readonly CatalogueEntry[];

/** Every result name an analysis may emit. */
export type ResultName = (typeof ENTRIES)[number]['name'];

/** The catalogue, by result name, in the order of the table above. */
export const RESULT_CATALOGUE: Readonly<Record<ResultName, CatalogueEntry>> = (() => {
  const byName: Partial<Record<ResultName, CatalogueEntry>> = {};
  for (const e of ENTRIES) byName[e.name] = e;
  return byName as Record<ResultName, CatalogueEntry>;
})();

export const RESULT_NAMES: readonly ResultName[] = ENTRIES.map((e) => e.name);

/**
 * The entry for a result name, or undefined for a name the catalogue does not know; with a block
 * kind, its label, meaning and source for that kind where they differ.
 */
export function catalogueEntry(name: string, kind?: BlockKind): CatalogueEntry | undefined {
  const e: CatalogueEntry | undefined = Object.prototype.hasOwnProperty.call(RESULT_CATALOGUE, name) ? RESULT_CATALOGUE[name as ResultName] : undefined;
  const special = kind !== undefined ? e?.byKind?.[kind] : undefined;
  return e && special ? { ...e, ...special } : e;
}
