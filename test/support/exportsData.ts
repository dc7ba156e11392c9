/**
 * Writes the data files of fixtures/exports/: invented instrument exports (preambles, units lines,
 * trailing delimiters, clock times, loss-peak frequencies, Latin-1 and UTF-16 bytes) generated from
 * the models below with seeded noise. Imported by the tests, it writes nothing and gives the
 * models and their parameters. Run: npx tsx test/support/exportsData.ts
 *
 * Materials, films, people and instruments are fictional.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import * as path from 'node:path';
import { pathToFileURL } from 'node:url';
import { gaussian } from './random.js';

/**
 * Two-line glass/liquid thickness model of an ellipsometric cooling scan, continuous at Tg
 * (the construction of Keddie, Jones & Cory, Europhys. Lett. 27, 59 (1994)):
 * h = h_Tg·(1 + α_g (T − Tg)) below Tg, h_Tg·(1 + α_l (T − Tg)) above.
 */
export interface ScanParameters {
  readonly seed: number;
  readonly tg: number;
  readonly hTg: number;
  readonly ag: number;
  readonly al: number;
  /** Cooling from tTop to tBottom (K) at rate q (K/min), one point every dt (s). */
  readonly tTop: number;
  readonly tBottom: number;
  readonly q: number;
  readonly dt: number;
  /** Standard deviation of the thickness noise, nm. */
  readonly noise: number;
}

export const SCANS = {
  'scan-V1-preamble.csv': { seed: 101, tg: 321.5, hTg: 400, ag: 1.5e-4, al: 6.0e-4, tTop: 362, tBottom: 282, q: 1, dt: 30, noise: 0.03 },
  'scan-V2-latin1.csv': { seed: 102, tg: 322.55, hTg: 385, ag: 1.7e-4, al: 6.5e-4, tTop: 358, tBottom: 280, q: 2, dt: 15, noise: 0.03 },
} as const satisfies Record<string, ScanParameters>;

export function thickness(p: ScanParameters, T: number): number {
  return p.hTg * (1 + (T < p.tg ? p.ag : p.al) * (T - p.tg));
}

/** Rows [t/s, T/K, h/nm] of a cooling scan. */
export function scanRows(p: ScanParameters): number[][] {
  const n = gaussian(p.seed);
  const rows: number[][] = [];
  const step = (p.q / 60) * p.dt;
  for (let k = 0; p.tTop - k * step >= p.tBottom - 1e-9; k++) {
    const T = p.tTop - k * step;
    rows.push([k * p.dt, T, thickness(p, T) + p.noise * n()]);
  }
  return rows;
}

/**
 * Isothermal transformation of a stable film: plateau at hVd until t1, a growth front that moves
 * at constant velocity until t2 (Swallen, Traynor, McMahon, Ediger & Mates, Phys. Rev. Lett. 102,
 * 065503 (2009)), plateau at hL. Times in s from the start of the hold.
 */
export const HOLD = { seed: 111, T: 330, hVd: 402.4, hL: 409.1, t1: 1800, t2: 7500, end: 10800, dt: 30, noise: 0.04, Tnoise: 0.02 } as const;

export function holdThickness(t: number): number {
  const { hVd, hL, t1, t2 } = HOLD;
  const x = t < t1 ? 0 : t > t2 ? 1 : (t - t1) / (t2 - t1);
  return hVd + (hL - hVd) * x;
}

/**
 * Decadic VFT law log10(τ/s) = A + B/(T − T0) (Vogel 1921, Fulcher 1925, Tammann & Hesse 1926),
 * sampled as dielectric loss-peak frequencies with scatter `noise` in decades. `definition` is how
 * the instrument's τ relates to f_max: τ = 1/(2π f_max) or τ = 1/f_max.
 */
export interface LossPeakParameters {
  readonly seed: number;
  readonly A: number;
  readonly B: number;
  readonly T0: number;
  readonly temperatures: readonly number[];
  readonly noise: number;
  readonly definition: 'angular' | 'cyclic';
}

const range = (from: number, to: number, step: number): number[] => Array.from({ length: Math.round((to - from) / step) + 1 }, (_, i) => from + i * step);

export const LOSS_PEAKS = {
  'loss-peaks-velvane.csv': { seed: 121, A: -13.5, B: 852.5, T0: 270, temperatures: range(326, 386, 4), noise: 0.02, definition: 'angular' },
  'loss-peaks-morrowite.txt': { seed: 123, A: -12.8, B: 820, T0: 205, temperatures: range(266, 326, 5), noise: 0.02, definition: 'cyclic' },
} as const satisfies Record<string, LossPeakParameters>;

/** Rows [T/K, f_max/Hz]. */
export function lossPeakRows(p: LossPeakParameters): number[][] {
  const n = gaussian(p.seed);
  return p.temperatures.map((T) => {
    const log10Tau = p.A + p.B / (T - p.T0) + p.noise * n();
    const tau = Math.pow(10, log10Tau);
    return [T, p.definition === 'angular' ? 1 / (2 * Math.PI * tau) : 1 / tau];
  });
}

/**
 * Heat flow of a DSC heating scan, Φ = m·q·Cp (the heat-flow form of ASTM E1269's heat
 * capacity), with Cp a logistic step from the glass to the liquid baseline: Cp in J/(g K), m in
 * mg, q in K/min. `sign` +1 when endotherms are written up, −1 when down; `perMass` writes W/g.
 */
export interface DscExport {
  readonly seed: number;
  readonly mass: number;
  readonly q: number;
  readonly step: number;
  readonly width: number;
  readonly noise: number;
  readonly sign: 1 | -1;
  readonly perMass: boolean;
}

export const DSC_EXPORTS = {
  'dsc-V1-mW-endo-up.txt': { seed: 131, mass: 5.21, q: 10, step: 324, width: 1.5, noise: 0.002, sign: 1, perMass: false },
  'dsc-V1-mW-exo-up.txt': { seed: 132, mass: 4.87, q: 10, step: 324, width: 1.5, noise: 0.002, sign: -1, perMass: false },
  'dsc-V2-Wg-endo-down.csv': { seed: 133, mass: 6.02, q: 10, step: 320, width: 1.5, noise: 0.0004, sign: -1, perMass: true },
  'dsc-V2-Wg-exo-down.csv': { seed: 134, mass: 5.5, q: 10, step: 320, width: 1.5, noise: 0.0004, sign: 1, perMass: true },
} as const satisfies Record<string, DscExport>;

export const cpGlass = (T: number): number => 1.18 + 0.003 * (T - 300);
export const cpLiquid = (T: number): number => 1.6 + 0.0018 * (T - 300);

/** Rows [t/min, T/°C, Φ (mW or W/g, signed as written)], from 290 K to 360 K every 0.5 K. */
export function dscRows(p: DscExport): number[][] {
  const n = gaussian(p.seed);
  const rows: number[][] = [];
  for (let k = 0; k <= 140; k++) {
    const T = 290 + 0.5 * k;
    const s = 1 / (1 + Math.exp(-(T - p.step) / p.width));
    const cp = cpGlass(T) + (cpLiquid(T) - cpGlass(T)) * s;
    // W/g = J/(g K) · K/s; mW = W/g · mg.
    const perGram = (cp * p.q) / 60;
    const phi = p.perMass ? perGram : perGram * p.mass;
    rows.push([(T - 290) / p.q, T - 273.15, p.sign * phi + p.noise * n()]);
  }
  return rows;
}

const clock = (s: number): string => {
  const h = Math.floor(s / 3600);
  const m = Math.floor((s % 3600) / 60);
  const sec = s % 60;
  return `${String(h).padStart(2, '0')}:${String(m).padStart(2, '0')}:${String(sec).padStart(2, '0')}`;
};

function latin1(text: string): Uint8Array {
  return Uint8Array.from(text, (c) => {
    const code = c.charCodeAt(0);
    if (code > 0xff) throw new Error(`not Latin-1: ${c}`);
    return code;
  });
}

function utf16le(text: string): Uint8Array {
  const out = new Uint8Array(2 + 2 * text.length);
  out[0] = 0xff;
  out[1] = 0xfe;
  for (let i = 0; i < text.length; i++) {
    out[2 + 2 * i] = text.charCodeAt(i) & 0xff;
    out[3 + 2 * i] = text.charCodeAt(i) >> 8;
  }
  return out;
}

/** Every data file of the fixture, by name: its bytes. */
export function exportFiles(): Map<string, Uint8Array> {
  const files = new Map<string, Uint8Array>();
  const utf8 = (s: string): Uint8Array => new TextEncoder().encode(s);

  // Scan 1: a preamble without "#", a blank line, the header, a units line; comma-delimited.
  {
    const p = SCANS['scan-V1-preamble.csv'];
    const rows = scanRows(p).map(([t, T, h]) => `${t}, ${T.toFixed(2)}, ${h.toFixed(3)}, ${(1.6120 - 2.0e-4 * (T - 300)).toFixed(4)}, ${(2.1 + 0.001 * t / 60).toFixed(2)}`);
    const text = [
      'Ellipsometer export (invented)',
      'Sample: film V-1 on silicon',
      'Operator: N. Quill',
      'Model: Cauchy layer on Si',
      'Export date: 2026-05-11 16:40',
      '',
      'Time, Temperature, Thickness, n(632.8 nm), MSE',
      's, K, nm, -, a.u.',
      ...rows,
    ].join('\r\n');
    files.set('scan-V1-preamble.csv', utf8(text + '\r\n'));
  }
  // Scan 2: Latin-1 bytes (° as 0xB0), °C, a comma at the end of every row.
  {
    const p = SCANS['scan-V2-latin1.csv'];
    const rows = scanRows(p).map(([t, T, h]) => `${t},${(T - 273.15).toFixed(2)},${h.toFixed(3)},`);
    files.set('scan-V2-latin1.csv', latin1(['Sample:\tfilm V-2', 'Angle of incidence:\t70°', 't/s,T/°C,h/nm,', ...rows].join('\n') + '\n'));
  }
  // Isothermal hold: tab-delimited, hh:mm:ss clock times, a "#" preamble.
  {
    const n = gaussian(HOLD.seed);
    const rows: string[] = [];
    for (let t = 0; t <= HOLD.end; t += HOLD.dt) rows.push(`${clock(t)}\t${(HOLD.T + HOLD.Tnoise * n()).toFixed(2)}\t${(holdThickness(t) + HOLD.noise * n()).toFixed(3)}`);
    files.set('hold-V1-hms.txt', utf8(['# Isothermal hold of film V-1', 'Hold: 330 K', '', 'Time\tTemperature (K)\tThickness (nm)', ...rows].join('\n') + '\n'));
  }
  // Dielectric loss peaks: f_max in Hz, UTF-8 with a byte-order mark, semicolons.
  {
    const rows = lossPeakRows(LOSS_PEAKS['loss-peaks-velvane.csv']).map(([T, f]) => `${T.toFixed(1)};${f.toPrecision(5)}`);
    files.set('loss-peaks-velvane.csv', utf8('\uFEFF' + ['Material: velvane', 'Fit: Havriliak-Negami, peak of the loss', 'Temperature (K);f_max (Hz)', ...rows].join('\r\n') + '\r\n'));
  }
  // Loss peaks in the log10 form, kHz, whitespace-delimited, τ defined as 1/f_max by the instrument.
  {
    const rows = lossPeakRows(LOSS_PEAKS['loss-peaks-morrowite.txt']).map(([T, f]) => `${T.toFixed(1)}    ${Math.log10(f / 1000).toFixed(4)}`);
    files.set('loss-peaks-morrowite.txt', utf8(['# Loss-peak positions of morrowite (invented), tau = 1/f_max', 'T (K)    log10(f_max/kHz)', ...rows].join('\n') + '\n'));
  }
  // Calorimetry: a preamble with the sample mass, a units line; UTF-16 for the mW exports.
  for (const [name, p] of Object.entries(DSC_EXPORTS) as Array<[keyof typeof DSC_EXPORTS, DscExport]>) {
    const rows = dscRows(p);
    if (!p.perMass) {
      const word = name.includes('endo-up') ? 'Endo Up' : 'Exo Up';
      const text = [
        'Calorimeter export (invented)',
        `Sample\tfilm V-1, pan ${p.seed - 130}`,
        `Sample mass\t${p.mass}\tmg`,
        'Pan\taluminium, hermetic',
        `Method\theat ${p.q} K/min from 16.85 °C`,
        '',
        `Time\tTemperature\tHeat Flow (${word})`,
        'min\t°C\tmW',
        ...rows.map(([t, T, phi]) => `${t.toFixed(3)}\t${T.toFixed(2)}\t${phi.toFixed(5)}`),
      ].join('\r\n');
      files.set(name, utf16le(text + '\r\n'));
    } else {
      const word = name.includes('endo-down') ? 'Endo Down' : 'Exo Down';
      const text = [
        `Sample: film V-2`,
        `Mass: ${p.mass} mg`,
        `Rate: ${p.q} K/min`,
        `Temperature (°C),Heat Flow (W/g) ${word},`,
        ...rows.map(([, T, phi]) => `${T.toFixed(2)},${phi.toFixed(6)},`),
      ].join('\n');
      files.set(name, utf8(text + '\n'));
    }
  }
  return files;
}

export const EXPORTS_DIR = path.resolve(import.meta.dirname, '..', '..', 'fixtures', 'exports', 'data');

function main(): void {
  mkdirSync(EXPORTS_DIR, { recursive: true });
  for (const [name, bytes] of exportFiles()) writeFileSync(path.join(EXPORTS_DIR, name), bytes);
  console.log('export fixtures written to', EXPORTS_DIR);
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) main();
