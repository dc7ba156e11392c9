/** The analysis of each block kind. Kinds without one yet produce no results. */
import type { BlockKind } from '../scan/blockHeader.js';
import { NO_ANALYSIS, type Analyzer } from './context.js';
import { analyzeDeposition } from './depositionAnalysis.js';
import { analyzeMaterial } from './materialAnalysis.js';
import { analyzeDsc } from './dscAnalysis.js';
import { analyzeIsotherm } from './isothermAnalysis.js';
import { analyzeRamp } from './rampAnalysis.js';
import { analyzeRelaxation } from './relaxationAnalysis.js';

const none: Analyzer = () => NO_ANALYSIS;

export const ANALYZERS: Readonly<Record<BlockKind, Analyzer>> = {
  material: analyzeMaterial,
  deposition: analyzeDeposition,
  ramp: analyzeRamp,
  isotherm: analyzeIsotherm,
  dsc: analyzeDsc,
  relaxation: analyzeRelaxation,
  results: none,
};
