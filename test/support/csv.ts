/** Reads CSV text as RFC 4180 defines it (quoted fields, doubled quotes, CRLF or LF): rows of fields. */
export function parseCsv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let field = '';
  let quoted = false;
  const endField = (): void => {
    row.push(field);
    field = '';
  };
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (quoted) {
      if (c === '"' && text[i + 1] === '"') {
        field += '"';
        i++;
      } else if (c === '"') quoted = false;
      else field += c;
    } else if (c === '"') quoted = true;
    else if (c === ',') endField();
    else if (c === '\n' || c === '\r') {
      if (c === '\r' && text[i + 1] === '\n') i++;
      endField();
      rows.push(row);
      row = [];
    } else field += c;
  }
  if (field !== '' || row.length > 0) {
    endField();
    rows.push(row);
  }
  return rows;
}

/** CSV text as records keyed by the header row. */
export function csvRecords(text: string): Array<Map<string, string>> {
  const [header, ...rows] = parseCsv(text);
  return rows.map((r) => new Map(header.map((h, i) => [h, r[i] ?? ''])));
}
