/** Builders of synthetic notebooks with known answers, for analysis tests. */
export const MATERIAL_BLOCK = (tg = 315, vft = '') =>
  `\`\`\`material M-1\nname: synthetic glass\ntg: ${tg} K\ntg_source: invented for the test\n${vft}\`\`\`\n`;

export const DEPOSITION_BLOCK = (id: string, tsub: number) =>
  `\`\`\`deposition ${id}\nmaterial: M-1\nsubstrate_temperature: ${tsub} K\nrate: 0.2 nm/s\nduration: 500 s\nbase_pressure: 1e-6 Pa\nsubstrate: silicon\n\`\`\`\n`;

export function tableBlock(kind: string, id: string, meta: string, header: string, rows: ReadonlyArray<readonly number[]>, digits = 6): string {
  return `\`\`\`${kind} ${id}\n${meta}---\n${header}\n${rows.map((r) => r.map((v) => Number(v.toFixed(digits))).join(', ')).join('\n')}\n\`\`\`\n`;
}
