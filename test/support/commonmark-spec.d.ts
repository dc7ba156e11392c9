declare module 'commonmark-spec' {
  const spec: { tests: Array<{ markdown: string; html: string; number: number; section: string }> };
  export default spec;
}
