/** Renders a Vega specification to SVG in Node (vega View, no canvas: the 'none' renderer). */
import * as vega from 'vega';

/**
 * The SVG of a compiled Vega spec. Vega's own log goes nowhere (it would print stack traces on
 * the terminal); when the chart cannot be drawn, the error thrown says why, in the words of
 * the first error Vega logged.
 */
export async function renderSvg(vegaSpec: Record<string, unknown>): Promise<string> {
  const logged: string[] = [];
  const logger = vega.logger(vega.Error, undefined, (_method, _level, args) => {
    const first = args[0];
    logged.push(first instanceof Error ? first.message : String(first));
  });
  let view: vega.View | undefined;
  try {
    view = new vega.View(vega.parse(vegaSpec as vega.Spec), { renderer: 'none', logger });
    return await view.toSVG();
  } catch (e) {
    throw new Error(logged[0] ?? (e instanceof Error ? e.message : String(e)), { cause: e });
  } finally {
    view?.finalize();
  }
}
