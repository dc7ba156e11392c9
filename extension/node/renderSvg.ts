/** Renders a Vega specification to SVG in Node (vega View, no canvas: the 'none' renderer). */
import * as vega from 'vega';

export async function renderSvg(vegaSpec: Record<string, unknown>): Promise<string> {
  const view = new vega.View(vega.parse(vegaSpec as vega.Spec), { renderer: 'none' });
  try {
    return await view.toSVG();
  } finally {
    view.finalize();
  }
}
