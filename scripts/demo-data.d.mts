/** Types of scripts/demo-data.mjs: the demo notebook's generating parameters and models. */

export interface CycleParameters {
  readonly seed: number;
  readonly tsub: number;
  readonly tg: number;
  readonly onset: number;
  readonly h0: number;
  readonly gain: number;
  readonly ag: number;
  readonly al: number;
  readonly q: number;
  readonly tmax: number;
  readonly noise: number;
}

export interface CycleModel {
  readonly vd: (T: number) => number;
  readonly lc: (T: number) => number;
  readonly glass: (T: number) => number;
  readonly liquid: (T: number) => number;
  readonly x: (T: number) => number;
}

export interface DscParameters {
  readonly seed: number;
  readonly step: number;
  readonly width: number;
  readonly peak: number;
  readonly peakAt: number;
  readonly peakWidth: number;
  readonly noise: number;
}

export declare const CORNER_WIDTH: number;
export declare const ONSET_WIDTH: number;
export declare const CYCLE_DT: number;
export declare const CYCLES: Readonly<Record<string, CycleParameters>>;
export declare function cycleModel(p: CycleParameters): CycleModel;
export declare function cycle(p: CycleParameters): number[][];
export declare const HOLD: { readonly seed: number; readonly hVd: number; readonly hL: number; readonly t1: number; readonly t2: number; readonly T: number; readonly Tnoise: number; readonly noise: number };
export declare const RELAXATION: { readonly seed: number; readonly A: number; readonly B: number; readonly T0: number; readonly noise: number };
export declare const DSC_SCANS: Readonly<Record<string, DscParameters>>;
export declare function cpGlass(T: number): number;
export declare function cpLiquid(T: number): number;
export declare function dscRows(p: DscParameters): number[][];
