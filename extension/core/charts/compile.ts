/** vega-lite → Vega, in the core; the hosts render the Vega specification (SVG in Node, canvas or SVG in the preview). */
import { compile } from 'vega-lite';
import type { VegaLiteSpec } from './figureSpec.js';

/** vega-lite's warnings are about our own specifications; they are collected, not printed. */
export const compileWarnings: string[] = [];

const quiet = {
  level(): number {
    return 0;
  },
  error(...args: readonly unknown[]) {
    compileWarnings.push(args.map(String).join(' '));
    return this;
  },
  warn(...args: readonly unknown[]) {
    compileWarnings.push(args.map(String).join(' '));
    return this;
  },
  info() {
    return this;
  },
  debug() {
    return this;
  },
};

export function toVega(spec: VegaLiteSpec): Record<string, unknown> {
  if (compileWarnings.length > 100) compileWarnings.length = 0;
  return compile(spec as unknown as Parameters<typeof compile>[0], { logger: quiet as unknown as NonNullable<Parameters<typeof compile>[1]>['logger'] }).spec as unknown as Record<string, unknown>;
}
