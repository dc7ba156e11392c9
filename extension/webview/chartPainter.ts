/**
 * Puts charts into their cards: renders each spec into its slot, wires the export buttons, and
 * finalises the views of a page when the page is drawn again. A chart that cannot be drawn leaves
 * a short message in its slot; nothing is thrown.
 */
import type { Config, View } from 'vega';
import type { FromWebview } from '../protocol/webview.js';
import { themedSpec, type ChartColours } from './chartConfig.js';
import { exportChart, renderChart } from './chartView.js';
import { h } from './dom.js';

/** The theme every chart of one drawing uses. */
export interface ChartStyle {
  readonly colours: ChartColours;
  readonly config: Config;
}

export type Post = (message: FromWebview) => void;

const FORMATS = ['svg', 'png'] as const;

export class ChartPainter {
  private views: View[] = [];
  private generation = 0;

  constructor(private readonly post: Post) {}

  /** Finalises every view of the previous drawing; charts still rendering are dropped when they finish. */
  reset(): void {
    this.generation++;
    for (const view of this.views) view.finalize();
    this.views = [];
  }

  /** Export buttons for a chart (disabled until the chart is drawn); put them where the card wants them. */
  exportButtons(label: string): HTMLButtonElement[] {
    return FORMATS.map((format) =>
      h('button', { className: 'export', text: format.toUpperCase(), attrs: { type: 'button', disabled: '', title: `Export ${label} as ${format.toUpperCase()}`, 'aria-label': `Export ${label} as ${format.toUpperCase()}`, 'data-format': format } }),
    );
  }

  /**
   * Draws `spec` into `slot`. `name` is the export's file name without extension; `buttons` come
   * from `exportButtons`.
   */
  paint(slot: HTMLElement, spec: unknown, style: ChartStyle, name: string, buttons: readonly HTMLButtonElement[]): void {
    const shown = themedSpec(spec, style.colours, { dropTitle: true });
    const exported = themedSpec(spec, style.colours);
    if (!shown || !exported) {
      this.fail(slot, buttons, 'the chart data are not a Vega specification');
      return;
    }
    const generation = this.generation;
    slot.classList.add('is-drawing');
    Promise.resolve()
      .then(() => renderChart(slot, shown, style.config))
      .then(
        (view) => {
          if (generation !== this.generation) {
            view.finalize();
            return;
          }
          this.views.push(view);
          slot.classList.remove('is-drawing');
          for (const button of buttons) {
            button.disabled = false;
            button.addEventListener('click', (event) => {
              event.stopPropagation();
              const format = button.dataset.format === 'png' ? 'png' : 'svg';
              exportChart(exported, style.config, style.colours.background, format).then(
                (data) => this.post({ type: 'export', name, format, data }),
                (error: unknown) => this.post({ type: 'error', message: `Could not export ${name} as ${format.toUpperCase()}: ${reason(error)}` }),
              );
            });
          }
        },
        (error: unknown) => {
          if (generation !== this.generation) return;
          this.fail(slot, buttons, reason(error));
          this.post({ type: 'error', message: `Chart ${name} not drawn: ${reason(error)}` });
        },
      );
  }

  private fail(slot: HTMLElement, buttons: readonly HTMLButtonElement[], why: string): void {
    slot.classList.remove('is-drawing');
    slot.classList.add('is-failed');
    slot.replaceChildren(h('p', { className: 'chart-failed', text: `Chart not drawn: ${why}` }));
    for (const button of buttons) button.hidden = true;
  }
}

function reason(error: unknown): string {
  const text = error instanceof Error ? error.message : String(error);
  return text.length > 160 ? `${text.slice(0, 157)}…` : text;
}
