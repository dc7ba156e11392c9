/**
 * The libraries that only `vitrine report` uses (the charts, their SVG drawing and the markdown
 * renderer), bundled on their own as dist/cli-report-libs.cjs: the command line loads them the
 * first time it writes a report, so that `check` and `analyze` neither read nor compile them.
 * scripts/build.mjs points the imports of these packages in the report's code here.
 */
export * as vega from 'vega';
export * as vegaLite from 'vega-lite';
export * as unified from 'unified';
export { default as remarkParse } from 'remark-parse';
export { default as remarkRehype } from 'remark-rehype';
export { default as rehypeSanitize } from 'rehype-sanitize';
export { default as rehypeStringify } from 'rehype-stringify';
