import assert from 'node:assert/strict';
import { MATERIAL_COLOURS, ROLE, SURFACE, type Role, type Theme } from '../../extension/core/charts/tokens.js';

// Colour-vision checks of the chart tokens. Each role colour is simulated as seen with
// protanopia and deuteranopia, and roles drawn alike must stay apart by a CIEDE2000 margin.

/**
 * Machado, Oliveira & Fernandes, "A physiologically-based model for simulation of color vision
 * deficiency", IEEE TVCG 15(6), 1291–1298 (2009): the severity 1.0 matrices (from memory of the
 * paper's table), applied to linear sRGB.
 */
const MACHADO = {
  protanopia: [
    [0.152286, 1.052583, -0.204868],
    [0.114503, 0.786281, 0.099216],
    [-0.003882, -0.048116, 1.051998],
  ],
  deuteranopia: [
    [0.367322, 0.860646, -0.227968],
    [0.280085, 0.672501, 0.047413],
    [-0.01182, 0.04294, 0.968881],
  ],
  normal: [
    [1, 0, 0],
    [0, 1, 0],
    [0, 0, 1],
  ],
} as const;

type Vision = keyof typeof MACHADO;

/** sRGB transfer function, IEC 61966-2-1. */
function linear(byte: number): number {
  const x = byte / 255;
  return x <= 0.04045 ? x / 12.92 : ((x + 0.055) / 1.055) ** 2.4;
}

function rgb(hex: string): [number, number, number] {
  return [1, 3, 5].map((i) => linear(parseInt(hex.slice(i, i + 2), 16))) as [number, number, number];
}

/** CIELAB (D65) of linear sRGB, CIE 15:2004 with the sRGB primaries of IEC 61966-2-1. */
function lab([r, g, b]: readonly number[]): [number, number, number] {
  const X = 0.4124564 * r + 0.3575761 * g + 0.1804375 * b;
  const Y = 0.2126729 * r + 0.7151522 * g + 0.072175 * b;
  const Z = 0.0193339 * r + 0.119192 * g + 0.9503041 * b;
  const f = (t: number) => (t > 216 / 24389 ? Math.cbrt(t) : ((24389 / 27) * t + 16) / 116);
  const [fx, fy, fz] = [f(X / 0.95047), f(Y), f(Z / 1.08883)];
  return [116 * fy - 16, 500 * (fx - fy), 200 * (fy - fz)];
}

/** The colour as seen with a vision, in CIELAB. */
function seen(hex: string, vision: Vision): [number, number, number] {
  const c = rgb(hex);
  const m = MACHADO[vision];
  return lab(m.map((row) => Math.min(1, Math.max(0, row[0] * c[0] + row[1] * c[1] + row[2] * c[2]))));
}

/** CIEDE2000 colour difference: Sharma, Wu & Dalal, Color Res. Appl. 30(1), 21 (2005). */
function deltaE00(p: readonly number[], q: readonly number[]): number {
  const rad = Math.PI / 180;
  const [L1, a1, b1] = p;
  const [L2, a2, b2] = q;
  const cBar = (Math.hypot(a1, b1) + Math.hypot(a2, b2)) / 2;
  const G = 0.5 * (1 - Math.sqrt(cBar ** 7 / (cBar ** 7 + 25 ** 7)));
  const [a1p, a2p] = [(1 + G) * a1, (1 + G) * a2];
  const [C1, C2] = [Math.hypot(a1p, b1), Math.hypot(a2p, b2)];
  const hue = (a: number, b: number) => (a === 0 && b === 0 ? 0 : ((Math.atan2(b, a) / rad) + 360) % 360);
  const [h1, h2] = [hue(a1p, b1), hue(a2p, b2)];
  let dh = 0;
  if (C1 * C2 !== 0) dh = h2 - h1 > 180 ? h2 - h1 - 360 : h2 - h1 < -180 ? h2 - h1 + 360 : h2 - h1;
  const dH = 2 * Math.sqrt(C1 * C2) * Math.sin((dh / 2) * rad);
  const lBar = (L1 + L2) / 2;
  const cBarP = (C1 + C2) / 2;
  let hBar = h1 + h2;
  if (C1 * C2 !== 0) hBar = Math.abs(h1 - h2) > 180 ? (h1 + h2 < 360 ? (h1 + h2 + 360) / 2 : (h1 + h2 - 360) / 2) : (h1 + h2) / 2;
  const T = 1 - 0.17 * Math.cos((hBar - 30) * rad) + 0.24 * Math.cos(2 * hBar * rad) + 0.32 * Math.cos((3 * hBar + 6) * rad) - 0.2 * Math.cos((4 * hBar - 63) * rad);
  const dTheta = 30 * Math.exp(-(((hBar - 275) / 25) ** 2));
  const RC = 2 * Math.sqrt(cBarP ** 7 / (cBarP ** 7 + 25 ** 7));
  const SL = 1 + (0.015 * (lBar - 50) ** 2) / Math.sqrt(20 + (lBar - 50) ** 2);
  const SC = 1 + 0.045 * cBarP;
  const SH = 1 + 0.015 * cBarP * T;
  const RT = -Math.sin(2 * dTheta * rad) * RC;
  const [l, c, h] = [(L2 - L1) / SL, (C2 - C1) / SC, dH / SH];
  return Math.sqrt(l * l + c * c + h * h + RT * c * h);
}

/** WCAG 2.1 contrast ratio of two sRGB colours. */
function contrast(a: string, b: string): number {
  const Y = (hex: string) => {
    const [r, g, bl] = rgb(hex);
    return 0.2126 * r + 0.7152 * g + 0.0722 * bl;
  };
  const [hi, lo] = [Y(a), Y(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}

const THEMES: readonly Theme[] = ['light', 'dark'];
const VISIONS: readonly Vision[] = ['normal', 'deuteranopia', 'protanopia'];
const ROLES = Object.keys(ROLE) as Role[];

/**
 * The margin asked of roles drawn alike. ΔE00 ≈ 1 is a just-noticeable difference between large
 * patches side by side; for 1–2 px lines and 5 px markers seen apart in a chart the difference
 * needed grows several-fold as the marks shrink (Stone, Szafir & Setlur, "An engineering model for
 * color difference as a function of size", Color and Imaging Conference 2014). Ten times the
 * large-patch threshold is our margin (common practice, no source for the exact number).
 */
const ALIKE_MARGIN = 10;

describe('chart colour tokens under colour-vision deficiency', () => {
  it('CIEDE2000 matches the worked pairs of Sharma, Wu & Dalal (2005), Table 1 (from memory)', () => {
    assert.ok(Math.abs(deltaE00([50, 2.6772, -79.7751], [50, 0, -82.7485]) - 2.0425) < 1e-4);
    assert.ok(Math.abs(deltaE00([50, 3.1571, -77.2803], [50, 0, -82.7485]) - 2.8615) < 1e-4);
    assert.ok(Math.abs(deltaE00([50, 2.8361, -74.02], [50, 0, -82.7485]) - 3.4412) < 1e-4);
  });

  it('the Machado matrices keep a neutral grey grey (each row sums to 1, a property of the model)', () => {
    for (const vision of VISIONS) {
      const [L, a, b] = seen('#808080', vision);
      assert.ok(Math.abs(a) < 0.05 && Math.abs(b) < 0.05 && Math.abs(L - 53.59) < 0.05, `${vision}: ${L} ${a} ${b}`);
    }
  });

  for (const theme of THEMES) {
    it(`${theme}: roles drawn alike (same dash) stay ${ALIKE_MARGIN} ΔE00 apart with normal vision, deuteranopia and protanopia`, () => {
      const failures: string[] = [];
      for (const vision of VISIONS) {
        for (let i = 0; i < ROLES.length; i++) {
          for (let j = i + 1; j < ROLES.length; j++) {
            const [p, q] = [ROLE[ROLES[i]], ROLE[ROLES[j]]];
            // Roles with different dashes (constructions, reference lines) are told apart by the dash.
            if (p.dash.join() !== q.dash.join()) continue;
            const d = deltaE00(seen(p[theme], vision), seen(q[theme], vision));
            if (d < ALIKE_MARGIN) failures.push(`${vision} ${ROLES[i]}/${ROLES[j]} ΔE00 ${d.toFixed(1)}`);
          }
        }
      }
      assert.deepEqual(failures, []);
    });

    it(`${theme}: as deposited, supercooled liquid and liquid-cooled glass, the three lines of every ramp, stay 15 ΔE00 apart under each vision`, () => {
      const three: Role[] = ['as-deposited', 'supercooled-liquid', 'liquid-cooled'];
      for (const vision of VISIONS) {
        for (let i = 0; i < 3; i++) {
          for (let j = i + 1; j < 3; j++) {
            const d = deltaE00(seen(ROLE[three[i]][theme], vision), seen(ROLE[three[j]][theme], vision));
            assert.ok(d >= 15, `${vision} ${three[i]}/${three[j]}: ${d.toFixed(1)}`);
          }
        }
      }
    });

    it(`${theme}: every role colour stands 3:1 against the chart background (WCAG 2.1, SC 1.4.11 non-text contrast)`, () => {
      for (const role of ROLES) assert.ok(contrast(ROLE[role][theme], SURFACE[theme].sheet) >= 3, `${role}: ${contrast(ROLE[role][theme], SURFACE[theme].sheet).toFixed(2)}`);
    });

    it(`${theme}: the first three material colours stay 15 ΔE00 apart under each vision (more materials lean on labels and the legend)`, () => {
      const list = MATERIAL_COLOURS[theme];
      for (const vision of VISIONS) {
        for (let i = 0; i < 3; i++) {
          for (let j = i + 1; j < 3; j++) {
            const d = deltaE00(seen(list[i], vision), seen(list[j], vision));
            assert.ok(d >= 15, `${vision} ${list[i]}/${list[j]}: ${d.toFixed(1)}`);
          }
        }
      }
    });
  }

  it('every role’s marker shape is one Vega draws', () => {
    const shapes = new Set(['circle', 'square', 'triangle-up', 'triangle-down', 'diamond', 'cross', 'wedge']);
    for (const role of ROLES) assert.ok(shapes.has(ROLE[role].shape), role);
  });
});
