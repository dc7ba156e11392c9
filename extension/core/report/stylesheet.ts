/**
 * The report's stylesheet, generated from Vitrine's design tokens (charts/tokens.ts): every
 * colour is a custom property built from SURFACE.light or SURFACE.dark, every font and size from
 * TYPE. No colour is written here (a test parses every colour in the output and finds it in the
 * tokens).
 *
 * The page is a bound lab notebook: paper with a faint ruled grid in the margin, a header band in
 * Vitrine's accent with the notebook's name and the record's date and version, each file a page
 * with its path as the running head. A data block is an entry pinned into the notebook: a sheet
 * with square corners, a specimen label strip (kind, id, line) and an offset paper shadow; its
 * conditions sit beside its figures, its findings below, each with a stamped severity tag. Tables
 * are ruled like a printed table (heavy top and bottom rules, a light one under the head), never
 * boxed. Charts follow the page: each is embedded in both themes and the colour-scheme query
 * shows one, so nothing needs a script.
 */
import { SURFACE, TYPE, type Surface } from '../charts/tokens.js';

const SURFACE_KEYS = Object.keys(SURFACE.light) as Array<keyof Surface>;

function properties(surface: Surface): string {
  return SURFACE_KEYS.map((k) => `--${k}: ${surface[k]};`).join(' ');
}

const px = (n: number): string => `${n}px`;

/** The stylesheet of the HTML report. */
export function reportStylesheet(): string {
  const size = TYPE.size;
  return `
:root { color-scheme: light dark; ${properties(SURFACE.light)}
  --font-text: ${TYPE.text}; --font-figures: ${TYPE.figures}; --font-mono: ${TYPE.mono};
  --size-small: ${px(size.small)}; --size-body: ${px(size.body)}; --size-lead: ${px(size.lead)}; --size-title: ${px(size.title)}; }
@media (prefers-color-scheme: dark) { :root { ${properties(SURFACE.dark)} } }
* { box-sizing: border-box; }
html { background: var(--paper); }
body { margin: 0; color: var(--ink); background: var(--paper); font-family: var(--font-text); font-size: var(--size-body); line-height: 1.55;
  background-image: linear-gradient(90deg, var(--grid) 1px, var(--paper) 1px), linear-gradient(var(--grid) 1px, var(--paper) 1px);
  background-size: 24px 24px; background-attachment: local; }
a { color: var(--accent); }
code, pre, .mono { font-family: var(--font-mono); font-size: 0.92em; }

/* The header band: the notebook's name and the record. */
header.band { background: var(--accent); color: var(--paper); padding: 22px 0 18px; border-bottom: 6px double var(--paper); outline: 1px solid var(--accent); }
header.band .inner, main { max-width: 1180px; margin: 0 auto; padding: 0 32px; }
header.band .what { font-family: var(--font-figures); font-size: var(--size-small); letter-spacing: 0.14em; text-transform: uppercase; margin: 0; opacity: 0.85; }
header.band h1 { font-size: var(--size-title); font-weight: 600; margin: 2px 0 10px; line-height: 1.25; }
dl.record { display: flex; flex-wrap: wrap; gap: 4px 28px; margin: 0; font-family: var(--font-figures); font-size: var(--size-small); }
dl.record div { display: flex; gap: 6px; }
dl.record dt { opacity: 0.8; text-transform: uppercase; letter-spacing: 0.08em; }
dl.record dd { margin: 0; font-weight: 600; overflow-wrap: anywhere; }
/* At night the band is a dark sheet with the name in the accent: a bright band would glare. */
@media (prefers-color-scheme: dark) {
  header.band { background: var(--sheet); color: var(--ink); border-bottom-color: var(--accent); outline-color: var(--rule); }
  header.band h1 { color: var(--accent); } }

main { background: var(--paper); padding-top: 8px; padding-bottom: 48px; }
p.lead { font-size: var(--size-lead); color: var(--pencil); margin: 20px 0 8px; }
nav.contents { font-family: var(--font-figures); font-size: var(--size-small); color: var(--pencil); border-top: 1px solid var(--rule); border-bottom: 1px solid var(--rule); padding: 6px 0; margin: 0 0 12px; }
nav.contents a { margin-right: 14px; }

/* Each file is a page: its path is the running head. */
section.page { margin: 36px 0 0; }
h2.file { font-family: var(--font-mono); font-size: var(--size-small); font-weight: normal; color: var(--pencil); letter-spacing: 0.04em;
  border-bottom: 3px double var(--rule); padding: 0 0 4px; margin: 0 0 12px; display: flex; justify-content: space-between; }
h2.file .folio { font-family: var(--font-figures); }
article h1 { font-size: var(--size-title); margin: 8px 0; }
article h2 { font-size: var(--size-lead); margin: 22px 0 6px; }
article h3, article h4 { font-size: var(--size-body); margin: 16px 0 4px; }
article pre { background: var(--sheet); border: 1px dotted var(--rule); padding: 8px 10px; overflow-x: auto; }
h2.part { font-size: var(--size-lead); font-family: var(--font-figures); text-transform: uppercase; letter-spacing: 0.12em; color: var(--accent);
  margin: 44px 0 10px; padding-bottom: 4px; border-bottom: 3px double var(--accent); }

/* A data block: an entry pinned into the notebook. */
section.entry { background: var(--sheet); border: 1px solid var(--rule); box-shadow: 4px 4px 0 var(--grid); margin: 18px 0 22px; padding: 0 0 12px; break-inside: avoid; }
.entry .strip { display: flex; align-items: baseline; gap: 12px; padding: 6px 14px; border-bottom: 1px dashed var(--rule); font-family: var(--font-figures); }
.entry .kind { font-size: var(--size-small); text-transform: uppercase; letter-spacing: 0.14em; color: var(--accent); }
.entry .id { font-family: var(--font-mono); font-size: var(--size-lead); font-weight: bold; }
.entry .about { color: var(--pencil); font-size: var(--size-small); }
.entry .where { margin-left: auto; color: var(--pencil); font-size: var(--size-small); white-space: nowrap; }
.entry .body { display: grid; grid-template-columns: minmax(0, auto) minmax(280px, 1fr); gap: 14px 24px; padding: 12px 14px 0; align-items: start; }
.entry.nochart .body { grid-template-columns: minmax(220px, 0.8fr) minmax(280px, 1.6fr); }
.entry .wide { grid-column: 1 / -1; }
@media (max-width: 960px) { .entry .body, .entry.nochart .body { grid-template-columns: minmax(0, 1fr); } }
h4.sub { font-family: var(--font-figures); font-size: var(--size-small); font-weight: normal; text-transform: uppercase; letter-spacing: 0.12em; color: var(--pencil); margin: 0 0 4px; }

/* Conditions as written: a specimen label. */
dl.conditions { display: grid; grid-template-columns: max-content minmax(0, 1fr); gap: 1px 12px; margin: 0 0 12px; font-size: var(--size-small); font-family: var(--font-figures); }
dl.conditions dt { color: var(--pencil); font-family: var(--font-mono); }
dl.conditions dd { margin: 0; overflow-wrap: anywhere; }
dl.conditions .canonical { color: var(--pencil); }

/* Figures: a printed table, ruled above and below. */
table { border-collapse: collapse; font-size: var(--size-small); font-family: var(--font-figures); }
table.figures, table.summary { width: 100%; border-top: 2px solid var(--ink); border-bottom: 2px solid var(--ink); }
th { text-align: left; font-weight: 600; border-bottom: 1px solid var(--ink); padding: 3px 8px 3px 0; vertical-align: bottom; }
td { padding: 3px 8px 3px 0; vertical-align: top; border-bottom: 1px solid var(--grid); }
td.num, th.num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
td .label { font-family: var(--font-text); font-style: italic; font-size: var(--size-body); }
td .name { display: block; color: var(--pencil); font-family: var(--font-mono); font-size: 0.9em; }
td .beside { display: block; color: var(--pencil); }
td.method { color: var(--pencil); }
td.method .interval { display: block; color: var(--ink); }
details.budget { margin-top: 2px; }
details.budget summary { cursor: pointer; color: var(--accent); }
details.budget table { margin: 2px 0 4px; }
details.budget td { border-bottom: 1px dotted var(--rule); }

/* Charts: the light drawing by day, the dark one at night. */
figure.chart { margin: 0; }
figure.chart .drawing svg { display: block; max-width: 100%; height: auto; }
figure.chart .on-dark { display: none; }
@media (prefers-color-scheme: dark) { figure.chart .on-light { display: none; } figure.chart .on-dark { display: block; } }
figure.chart figcaption { font-size: var(--size-small); color: var(--pencil); margin-top: 4px; font-family: var(--font-figures); }
figure.chart figcaption b { color: var(--ink); font-weight: 600; }

/* Notes that stand in for something: a dashed frame, all round. */
.stand-in { border: 1px dashed var(--warning); color: var(--pencil); padding: 8px 12px; font-style: italic; margin: 0; }

/* The table as it was read, for a table that failed. */
figure.excerpt { margin: 0; }
figure.excerpt figcaption { font-size: var(--size-small); color: var(--pencil); font-family: var(--font-figures); margin-bottom: 2px; }
figure.excerpt pre { margin: 0; padding: 6px 10px; background: var(--paper); border: 1px dotted var(--rule); overflow-x: auto; font-size: var(--size-small); line-height: 1.45; }
figure.excerpt .ln { display: inline-block; min-width: 3.5em; color: var(--pencil); user-select: none; }

/* Findings: each with a stamped severity tag. */
ol.findings { list-style: none; margin: 0; padding: 0; font-size: var(--size-small); font-family: var(--font-figures); }
ol.findings li { display: grid; grid-template-columns: 5.6em 4.6em minmax(0, 1fr); gap: 8px; padding: 4px 0; border-top: 1px dotted var(--rule); align-items: baseline; }
ol.findings .tag { text-align: center; text-transform: uppercase; letter-spacing: 0.08em; font-size: 0.85em; border: 1px solid currentColor; padding: 0 4px; }
ol.findings .error .tag { color: var(--error); } ol.findings .warning .tag { color: var(--warning); } ol.findings .info .tag, ol.findings .hint .tag { color: var(--info); }
ol.findings .at { color: var(--pencil); white-space: nowrap; }
ol.findings code { color: var(--pencil); }
ol.findings ol.related { list-style: none; margin: 2px 0 0; padding: 0; }
ol.findings ol.related li { display: block; border: 0; padding: 0; }
ol.findings .place { font-family: var(--font-mono); color: var(--pencil); }
p.clean { color: var(--good); font-size: var(--size-small); font-family: var(--font-figures); margin: 0; }

/* The stability maps, each at its own drawn size. */
.maps { display: flex; flex-wrap: wrap; gap: 20px; align-items: flex-start; }
figure.map figcaption { font-family: var(--font-figures); margin-bottom: 6px; }
figure.map { background: var(--sheet); border: 1px solid var(--rule); box-shadow: 4px 4px 0 var(--grid); padding: 10px; margin: 0; }
figure.map .drawing svg { display: block; width: auto; max-width: 100%; height: auto; }

footer { margin: 48px 0 0; padding-top: 8px; border-top: 3px double var(--rule); color: var(--pencil); font-size: var(--size-small); }
@media print {
  body { background-image: none; }
  header.band { break-after: avoid; }
  section.entry, figure.map { box-shadow: none; }
}
`;
}
