/** Renders a Vega specification to SVG in Node (vega View, no canvas: the 'none' renderer). */
import * as vega from 'vega';

export interface SvgOptions {
  /**
   * For print: the SVG's width and height in centimetres (at 96 px to the inch, the CSS pixel),
   * its viewBox unchanged, so that a chart made with `{ print: true }` is placed at one journal
   * column's width by any layout program.
   */
  readonly physicalSize?: boolean;
}

/**
 * The SVG of a compiled Vega spec. Vega's own log goes nowhere (it would print stack traces on
 * the terminal); when the chart cannot be drawn, the error thrown says why, in the words of
 * the first error Vega logged.
 */
export async function renderSvg(vegaSpec: Record<string, unknown>, options: SvgOptions = {}): Promise<string> {
  const logged: string[] = [];
  const logger = vega.logger(vega.Error, undefined, (_method, _level, args) => {
    const first = args[0];
    logged.push(first instanceof Error ? first.message : String(first));
  });
  let view: vega.View | undefined;
  try {
    view = new vega.View(vega.parse(vegaSpec as vega.Spec), { renderer: 'none', logger });
    const svg = stableClipIds(await view.toSVG());
    return options.physicalSize ? inCentimetres(svg) : svg;
  } catch (e) {
    throw new Error(logged[0] ?? (e instanceof Error ? e.message : String(e)), { cause: e });
  } finally {
    view?.finalize();
  }
}

/** The root element's width and height in cm (2.54 cm to 96 px), to 0.01 cm. */
function inCentimetres(svg: string): string {
  return svg.replace(/^<svg\b[^>]*>/, (root) => root.replace(/\b(width|height)="([\d.]+)"/g, (_all, name: string, px: string) => `${name}="${((Number(px) * 2.54) / 96).toFixed(2)}cm"`));
}

/**
 * Vega numbers clip paths from a counter that lives as long as the process (`clip7` in the
 * seventh chart drawn): numbered again from 1 in the order they appear, the same chart is the
 * same SVG whatever was drawn before it.
 */
function stableClipIds(svg: string): string {
  const renamed = new Map<string, string>();
  return svg.replace(/\bclip(\d+)\b/g, (_all, n: string) => {
    let to = renamed.get(n);
    if (to === undefined) {
      to = `clip${renamed.size + 1}`;
      renamed.set(n, to);
    }
    return to;
  });
}
