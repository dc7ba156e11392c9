/**
 * Draws compiled Vega specs. Expressions are interpreted from their parsed form (`ast: true` and
 * vega-interpreter), so nothing is compiled with `eval` or `new Function` and the page's Content
 * Security Policy can forbid both.
 */
import * as vega from 'vega';
import { expressionInterpreter } from 'vega-interpreter';

/** A logger that keeps errors and warnings instead of printing them. */
function collectingLogger(errors: string[]): vega.LoggerInterface {
  let level = vega.Warn;
  const logger = {
    level(next?: number) {
      if (next === undefined) return level;
      level = next;
      return logger;
    },
    error(...args: readonly unknown[]) {
      errors.push(args.map(String).join(' '));
      return logger;
    },
    warn() {
      return logger;
    },
    info() {
      return logger;
    },
    debug() {
      return logger;
    },
  };
  return logger as unknown as vega.LoggerInterface;
}

function newView(spec: Record<string, unknown>, config: vega.Config, errors: string[], options: vega.ViewOptions): vega.View {
  const runtime = vega.parse(spec as vega.Spec, config, { ast: true });
  return new vega.View(runtime, { ...options, expr: expressionInterpreter, logger: collectingLogger(errors) });
}

/**
 * Renders a spec as SVG into `container`. Rejects, with the view finalised, when the spec cannot
 * be parsed, the dataflow reports an error, or nothing was drawn.
 */
export async function renderChart(container: HTMLElement, spec: Record<string, unknown>, config: vega.Config): Promise<vega.View> {
  const errors: string[] = [];
  const view = newView(spec, config, errors, { renderer: 'svg', container, hover: false });
  try {
    await view.runAsync();
    if (errors.length > 0) throw new Error(errors[0]);
    if (!container.querySelector('svg')) throw new Error('the chart drew nothing');
    return view;
  } catch (error) {
    view.finalize();
    throw error;
  }
}

/**
 * The chart as an SVG document or a PNG data URL (twice the pixels), drawn headless from the
 * same spec with an explicit background colour.
 */
export async function exportChart(spec: Record<string, unknown>, config: vega.Config, background: string, format: 'svg' | 'png'): Promise<string> {
  const errors: string[] = [];
  const view = newView(spec, config, errors, { renderer: 'none' });
  try {
    view.background(background);
    await view.runAsync();
    if (errors.length > 0) throw new Error(errors[0]);
    return format === 'svg' ? await view.toSVG() : await view.toImageURL('png', 2);
  } finally {
    view.finalize();
  }
}
