import assert from 'node:assert/strict';
import * as fs from 'node:fs';
import * as path from 'node:path';
import type { CodeAction, CodeLens, CompletionItem, Diagnostic, DocumentSymbol, Hover, Location, TextEdit, WorkspaceEdit } from 'vscode-languageserver-protocol';
import { URI } from 'vscode-uri';
import { InMemoryHost, LineIndex, Notebook } from '../../extension/core/index.js';
import { REPO } from '../support/loadNotebook.js';
import { startServer, tempNotebook, uriOf, type Client } from '../support/lspClient.js';

// The built language server over stdio, driven by a real JSON-RPC client as an editor drives it.

const MATERIAL = '```material M-1\nname: test glass\ntg: 300 K\ntg_source: invented for the test\nvft:\n  log10_tau0: -14\n  B: 1008 K\n  T0: 237 K\n```\n';
const DEPOSITION = '```deposition D-1\nmaterial: M-1\nsubstrate_temperature: 255 K\nrate: 0.2 nm/s\nduration: 1000 s\nthickness: 200 nm\nbase_pressure: 1e-6 Pa\nsubstrate: silicon\n```\n';

function copyDemo(): string {
  const root = tempNotebook({});
  fs.cpSync(path.join(REPO, 'fixtures', 'demo'), root, { recursive: true });
  return root;
}

/** Applies LSP text edits to a text (positions into the text as given, BOM included). */
function applyEdits(text: string, edits: readonly TextEdit[]): string {
  const lines = new LineIndex(text);
  const spans = edits.map((e) => ({ start: lines.offsetAt(e.range.start), end: lines.offsetAt(e.range.end), text: e.newText })).sort((a, b) => b.start - a.start);
  let out = text;
  for (const s of spans) out = out.slice(0, s.start) + s.text + out.slice(s.end);
  return out;
}

function editsFor(edit: WorkspaceEdit | null | undefined, uri: string): TextEdit[] {
  return edit?.changes?.[uri] ?? [];
}

async function lenses(client: Client, uri: string): Promise<CodeLens[]> {
  return client.connection.sendRequest('textDocument/codeLens', { textDocument: { uri } });
}

describe('language server over stdio', function () {
  this.timeout(60000);
  let root = '';
  let client: Client;

  afterEach(async () => {
    await client?.stop();
    if (root) fs.rmSync(root, { recursive: true, force: true });
    root = '';
  });

  it('publishes diagnostics while typing, with code, source, range and a link to the list of codes', async () => {
    root = tempNotebook({ 'm.md': MATERIAL, 'd.md': DEPOSITION });
    client = await startServer(root);
    const uri = uriOf(path.join(root, 'd.md'));
    const broken = DEPOSITION.replace('rate: 0.2 nm/s\n', '');
    client.open(uri, DEPOSITION);
    await client.waitForDiagnostics(uri, (d) => d.length === 0);
    client.change(uri, broken, 2);
    const diags = await client.waitForDiagnostics(uri, (d, v) => v === 2 && d.length > 0);
    const missing = diags.find((d) => d.code === 'meta.missing-required');
    assert.ok(missing, JSON.stringify(diags));
    assert.equal(missing.source, 'vitrine');
    assert.equal(missing.severity, 1);
    assert.deepEqual(missing.range.start, { line: 0, character: 14 }, 'on the block id');
    assert.match(missing.codeDescription?.href ?? '', /README\.md#diagnostic-codes$/);
    client.change(uri, DEPOSITION, 3);
    await client.waitForDiagnostics(uri, (d, v) => v === 3 && d.length === 0);
  });

  it('shows missing recommended metadata only after a save, and waits for a save in onSave mode', async () => {
    root = tempNotebook({ 'm.md': MATERIAL, 'd.md': DEPOSITION });
    client = await startServer(root, { diagnostics: { run: 'onSave' } });
    const uri = uriOf(path.join(root, 'd.md'));
    client.open(uri, DEPOSITION);
    await client.waitForDiagnostics(uri, (d) => d.length === 0);
    const noPressure = DEPOSITION.replace('base_pressure: 1e-6 Pa\n', '').replace('rate: 0.2 nm/s', 'rate: 0.2');
    client.change(uri, noPressure, 2);
    await new Promise((r) => setTimeout(r, 800));
    assert.deepEqual(client.diagnostics.get(uri)?.diagnostics, [], 'nothing while typing in onSave mode');
    client.save(uri);
    const after = await client.waitForDiagnostics(uri, (d) => d.length > 0);
    assert.ok(after.some((d) => d.code === 'quantity.bare-number'));
    assert.ok(after.some((d) => d.code === 'meta.missing-recommended' && String(d.message).includes('base_pressure')));
  });

  it('keeps save-phase findings for the next save while typing', async () => {
    root = tempNotebook({ 'm.md': MATERIAL, 'd.md': DEPOSITION });
    client = await startServer(root);
    const uri = uriOf(path.join(root, 'd.md'));
    client.open(uri, DEPOSITION);
    await client.waitForDiagnostics(uri, (d) => d.length === 0);
    const noSubstrate = DEPOSITION.replace('substrate: silicon\n', '');
    client.change(uri, noSubstrate, 2);
    const typing = await client.waitForDiagnostics(uri, (_d, v) => v === 2);
    assert.ok(!typing.some((d) => d.code === 'meta.missing-recommended'), 'not while typing');
    client.save(uri);
    await client.waitForDiagnostics(uri, (d) => d.some((x) => x.code === 'meta.missing-recommended'));
  });

  it('shows the headline figures of every data block as lenses, stable while a block is edited', async () => {
    root = copyDemo();
    client = await startServer(root);
    const file = path.join(root, 'days', '2026-03-02.md');
    const uri = uriOf(file);
    const text = fs.readFileSync(file, 'utf8');
    client.open(uri, text);
    await client.waitForDiagnostics(uri, () => true);
    const first = await lenses(client, uri);
    const blockCount = (text.match(/^```(deposition|ramp|isotherm|dsc|material|relaxation|results)/gm) ?? []).length;
    assert.equal(first.length, blockCount);
    const ramp = first.find((l) => l.command?.title.startsWith('Tg '));
    assert.ok(ramp, first.map((l) => l.command?.title).join('\n'));
    assert.match(ramp.command!.title, /^Tg \d+(\.\d+)? ± \d+(\.\d+)? K · Tf /);
    assert.equal(ramp.command!.command, 'vitrine.showChart');
    const line = ramp.range.start.line;
    assert.match(text.split('\n')[line], /^```ramp/);
    // Break the ramp's rate while typing: the lens keeps its figures, marked as updating.
    const broken = text.replace('rate: 1 K/min\ndirection: cycle', 'rate: 1 K/mi\ndirection: cycle');
    assert.notEqual(broken, text);
    client.change(uri, broken, 2);
    const during = await lenses(client, uri);
    assert.equal(during.length, blockCount);
    const same = during.find((l) => l.range.start.line === line)!;
    assert.ok(same.command!.title.startsWith(ramp.command!.title.split(' · ')[0]), same.command!.title);
    client.change(uri, text, 3);
    await client.waitForDiagnostics(uri, (_d, v) => v === 3);
    const after = await lenses(client, uri);
    assert.equal(after.find((l) => l.range.start.line === line)!.command!.title, ramp.command!.title);
  });

  it('answers hovers on references, quantities and block headers', async () => {
    root = tempNotebook({ 'm.md': MATERIAL, 'd.md': DEPOSITION });
    client = await startServer(root);
    const uri = uriOf(path.join(root, 'd.md'));
    client.open(uri, DEPOSITION);
    await client.waitForDiagnostics(uri, () => true);
    const onRef: Hover = await client.connection.sendRequest('textDocument/hover', { textDocument: { uri }, position: { line: 1, character: 12 } });
    assert.match(JSON.stringify(onRef.contents), /material M-1/);
    const onTemp: Hover = await client.connection.sendRequest('textDocument/hover', { textDocument: { uri }, position: { line: 2, character: 25 } });
    assert.match(JSON.stringify(onTemp.contents), /255 K = -18\.15 °C/);
    const onRate: Hover = await client.connection.sendRequest('textDocument/hover', { textDocument: { uri }, position: { line: 3, character: 8 } });
    assert.match(JSON.stringify(onRate.contents), /2 Å\/s/);
    const onHeader: Hover = await client.connection.sendRequest('textDocument/hover', { textDocument: { uri }, position: { line: 0, character: 15 } });
    assert.match(JSON.stringify(onHeader.contents), /Tsub\/Tg/);
  });

  it('shows the lines of a failed data table as read, on the data path and on the fence line', async () => {
    const ramp = '```ramp R-1\nfilm: D-1\nrate: 1 K/min\ndata: scan.csv\n```\n';
    root = tempNotebook({ 'm.md': MATERIAL, 'd.md': DEPOSITION, 'r.md': ramp, 'scan.csv': 'T/K; h/nm\n300; 100.0\n301; lots\n302; 100.2\n' });
    client = await startServer(root);
    const uri = uriOf(path.join(root, 'r.md'));
    client.open(uri, ramp);
    await client.waitForDiagnostics(uri, (d) => d.length > 0);
    const onData: Hover = await client.connection.sendRequest('textDocument/hover', { textDocument: { uri }, position: { line: 3, character: 9 } });
    const text = JSON.stringify(onData.contents);
    assert.match(text, /The table as read/);
    assert.match(text, /301; lots/);
    const onFence: Hover = await client.connection.sendRequest('textDocument/hover', { textDocument: { uri }, position: { line: 0, character: 9 } });
    assert.match(JSON.stringify(onFence.contents), /301; lots/);
  });

  it('goes to definitions, finds references and renames ids across files in one edit', async () => {
    root = tempNotebook({ 'm.md': MATERIAL, 'd.md': DEPOSITION, 'e.md': DEPOSITION.replace('D-1', 'D-2') });
    client = await startServer(root);
    const d = uriOf(path.join(root, 'd.md'));
    const m = uriOf(path.join(root, 'm.md'));
    client.open(d, DEPOSITION);
    await client.waitForDiagnostics(d, () => true);
    const def: Location = await client.connection.sendRequest('textDocument/definition', { textDocument: { uri: d }, position: { line: 1, character: 11 } });
    assert.equal(def.uri, m);
    assert.deepEqual(def.range, { start: { line: 0, character: 12 }, end: { line: 0, character: 15 } });
    const refs: Location[] = await client.connection.sendRequest('textDocument/references', { textDocument: { uri: m }, position: { line: 0, character: 13 }, context: { includeDeclaration: true } });
    assert.equal(refs.length, 3);
    const edit: WorkspaceEdit = await client.connection.sendRequest('textDocument/rename', { textDocument: { uri: m }, position: { line: 0, character: 13 }, newName: 'M-7' });
    assert.deepEqual(Object.keys(edit.changes ?? {}).sort(), [d, uriOf(path.join(root, 'e.md')), m].sort());
    assert.equal(applyEdits(DEPOSITION, editsFor(edit, d)), DEPOSITION.replace('material: M-1', 'material: M-7'));
    assert.equal(applyEdits(MATERIAL, editsFor(edit, m)), MATERIAL.replace('material M-1', 'material M-7'));
    const taken = await client.connection.sendRequest('textDocument/rename', { textDocument: { uri: m }, position: { line: 0, character: 13 }, newName: 'D-2' });
    assert.equal(taken, null, 'a name already in use is refused');
    const symbols: DocumentSymbol[] = await client.connection.sendRequest('textDocument/documentSymbol', { textDocument: { uri: d } });
    assert.deepEqual(symbols.map((s) => s.name), ['deposition D-1']);
    const all: Array<{ name: string }> = await client.connection.sendRequest('workspace/symbol', { query: 'D-' });
    assert.deepEqual(all.map((s) => s.name).sort(), ['deposition D-1', 'deposition D-2']);
  });

  it('completes block kinds, keys, ids, units and data paths', async () => {
    root = tempNotebook({ 'm.md': MATERIAL, 'data/r.csv': 'T/K, h/nm\n300, 1\n', 'x.md': '' });
    client = await startServer(root);
    const uri = uriOf(path.join(root, 'x.md'));
    const text = '```ra\n```\n\n```ramp R-1\nfilm: \nrate: 10 \ndata: da\nfi\n```\n\n```deposition D-9\nmaterial: \n```\n';
    client.open(uri, text);
    await client.waitForDiagnostics(uri, () => true);
    const at = async (line: number, character: number): Promise<string[]> => ((await client.connection.sendRequest('textDocument/completion', { textDocument: { uri }, position: { line, character } })) as CompletionItem[]).map((c) => c.label);
    assert.deepEqual(await at(0, 5), ['ramp']);
    assert.deepEqual(await at(4, 6), ['D-9']);
    assert.ok((await at(5, 9)).includes('K/min'));
    assert.deepEqual(await at(6, 8), ['data/r.csv']);
    const keys = await at(7, 2);
    assert.ok(keys.includes('film') && keys.includes('windows') && keys.includes('reference_temperature'), keys.join(','));
    assert.deepEqual(await at(11, 10), ['M-1']);
  });

  it('applies quick fixes and writes and refreshes results blocks byte for byte, CRLF and BOM kept', async () => {
    const crlf = ('\uFEFF' + MATERIAL + '\n' + DEPOSITION.replace('substrate_temperature: 255 K', 'substrate_temperature: 255').replace('rate: 0.2 nm/s\n', '')).replace(/\n/g, '\r\n');
    root = tempNotebook({ 'd.md': crlf });
    client = await startServer(root);
    const uri = uriOf(path.join(root, 'd.md'));
    client.open(uri, crlf);
    const diags = await client.waitForDiagnostics(uri, (d) => d.length > 0);
    const bare = diags.find((d) => d.code === 'quantity.bare-number')!;
    const actions: CodeAction[] = await client.connection.sendRequest('textDocument/codeAction', { textDocument: { uri }, range: bare.range, context: { diagnostics: diags } });
    const unitFix = actions.find((a) => a.title === 'Write the unit: 255 K')!;
    assert.equal(applyEdits(crlf, editsFor(unitFix.edit, uri)), crlf.replace('substrate_temperature: 255\r\n', 'substrate_temperature: 255 K\r\n'));
    const insert = actions.find((a) => a.title === 'Insert the missing required keys')!;
    assert.equal(applyEdits(crlf, editsFor(insert.edit, uri)), crlf.replace('```deposition D-1\r\n', '```deposition D-1\r\nrate: ? nm/s\r\n'));

    // Record the figures of D-1 below it, then make them stale and refresh them.
    const fixed = applyEdits(crlf, [...editsFor(unitFix.edit, uri), ...editsFor(insert.edit, uri)]).replace('rate: ? nm/s', 'rate: 0.2 nm/s');
    client.change(uri, fixed, 2);
    await client.waitForDiagnostics(uri, (_d, v) => v === 2);
    const line = fixed.split('\r\n').findIndex((l) => l.startsWith('```deposition'));
    const record: CodeAction[] = await client.connection.sendRequest('textDocument/codeAction', { textDocument: { uri }, range: { start: { line: line + 1, character: 0 }, end: { line: line + 1, character: 0 } }, context: { diagnostics: [] } });
    const write = record.find((a) => a.title.startsWith('Record the figures of D-1'))!;
    const recorded = applyEdits(fixed, editsFor(write.edit, uri));
    assert.ok(recorded.startsWith(fixed), 'only appended');
    assert.match(recorded.slice(fixed.length), /^\r\n```results\r\nof: D-1\r\ninputs: "[0-9a-z]+"\r\ntsub_over_tg: 0\.85\d*\r\nexpected_thickness: 200(\.0*)? nm\r\n```\r\n$/);
    assert.ok(!recorded.slice(1).includes('\uFEFF') && recorded.startsWith('\uFEFF'));
    client.change(uri, recorded, 3);
    await client.waitForDiagnostics(uri, (d, v) => v === 3 && d.length === 0);
    const stale = recorded.replace('substrate_temperature: 255 K', 'substrate_temperature: 260 K');
    client.change(uri, stale, 4);
    const staleDiags = await client.waitForDiagnostics(uri, (d, v) => v === 4 && d.some((x) => x.code === 'results.stale'));
    const refresh: CodeAction[] = await client.connection.sendRequest('textDocument/codeAction', { textDocument: { uri }, range: staleDiags[0].range, context: { diagnostics: staleDiags } });
    const fix = refresh.find((a) => a.title === 'Refresh the recorded figures')!;
    const refreshed = applyEdits(stale, editsFor(fix.edit, uri));
    assert.equal(refreshed.slice(0, stale.indexOf('```results')), stale.slice(0, stale.indexOf('```results')));
    assert.match(refreshed, /tsub_over_tg: 0\.867\r\n/);
    const source: CodeAction[] = await client.connection.sendRequest('textDocument/codeAction', { textDocument: { uri }, range: staleDiags[0].range, context: { diagnostics: [], only: ['source.vitrine.refreshResults'] } });
    assert.equal(applyEdits(stale, editsFor(source[0].edit, uri)), refreshed);
    client.change(uri, refreshed, 5);
    await client.waitForDiagnostics(uri, (d, v) => v === 5 && d.length === 0);
  });

  it('survives a block typed character by character and ends with the fresh engine’s diagnostics', async () => {
    root = tempNotebook({ 'm.md': MATERIAL, 'd.md': '' });
    client = await startServer(root);
    const uri = uriOf(path.join(root, 'd.md'));
    const target = '# Day\n\n' + DEPOSITION.replace('base_pressure: 1e-6 Pa\n', 'base_pressure: 1e-6\n') + '\nDone.\n';
    client.open(uri, '');
    let version = 1;
    for (let i = 1; i <= target.length; i++) {
      const text = target.slice(0, i);
      client.change(uri, text, ++version);
      const ls = await lenses(client, uri);
      for (const l of ls) assert.ok(l.range.start.line < text.split('\n').length, 'lens inside the document');
    }
    const final = await client.waitForDiagnostics(uri, (_d, v) => v === version);
    const lines = new LineIndex(target);
    for (const d of final) assert.ok(lines.offsetAt(d.range.end) <= target.length && d.range.end.line < lines.lineCount);
    const nb = new Notebook(new InMemoryHost());
    nb.setFile('m.md', MATERIAL);
    nb.setFile('d.md', target);
    const fresh = nb.analyze({ only: ['d.md'] }).files[0].blocks.flatMap((b) => b.diagnostics).map((d) => `${d.code}@${lines.positionAt(d.span.start).line}`);
    assert.deepEqual(final.map((d: Diagnostic) => `${d.code}@${d.range.start.line}`).sort(), fresh.sort());
    assert.ok(!client.log.some((l) => / failed: /.test(l)), client.log.join('\n'));
  });

  it('returns the compiled charts of a file and the workspace summary', async () => {
    root = copyDemo();
    client = await startServer(root);
    const uri = uriOf(path.join(root, 'days', '2026-03-02.md'));
    const charts: { blocks: Array<{ kind: string; vega: unknown; figures: Array<{ label: string }> }> } = await client.connection.sendRequest('vitrine/charts', { uri, theme: 'dark' });
    const ramp = charts.blocks.find((b) => b.kind === 'ramp')!;
    assert.ok(ramp.vega && typeof ramp.vega === 'object' && '$schema' in (ramp.vega as object));
    assert.ok(ramp.figures.some((f) => f.label === 'Tg'));
    const summary: { columns: string[]; rows: unknown[]; maps: unknown[] } = await client.connection.sendRequest('vitrine/summary', { theme: 'light' });
    assert.ok(summary.rows.length >= 3);
    assert.ok(summary.maps.length >= 1);
  });

  it('accepts file URIs escaped as VS Code escapes them, in a folder with reserved characters', async () => {
    root = tempNotebook({});
    const dir = path.join(root, 'Lab (copy) #1');
    fs.mkdirSync(dir);
    fs.writeFileSync(path.join(dir, 'm.md'), MATERIAL);
    fs.writeFileSync(path.join(dir, 'd.md'), DEPOSITION);
    client = await startServer(dir);
    const uri = URI.file(path.join(dir, 'd.md')).toString();
    assert.match(uri, /%28copy%29/);
    const broken = DEPOSITION.replace('rate: 0.2 nm/s\n', '');
    client.open(uri, broken);
    const diags = await client.waitForDiagnostics(uri, (d) => d.some((x) => x.code === 'meta.missing-required'));
    assert.equal(diags.filter((d) => d.code === 'meta.missing-required').length, 1);
    assert.equal((await lenses(client, uri)).length, 1);
    // The editor's text wins: nothing republishes this file from the disk's complete text.
    await new Promise((r) => setTimeout(r, 600));
    assert.ok(client.diagnostics.get(uri)!.diagnostics.some((x) => x.code === 'meta.missing-required'));
  });

  it('answers malformed requests with JSON-RPC errors and keeps running', async () => {
    root = tempNotebook({ 'm.md': MATERIAL });
    client = await startServer(root);
    await assert.rejects(client.connection.sendRequest('vitrine/charts', { uri: 42 }), (e: { code?: number }) => e.code === -32602);
    await assert.rejects(client.connection.sendRequest('vitrine/no-such-method', {}), (e: { code?: number }) => e.code === -32601);
    const hover = await client.connection.sendRequest('textDocument/hover', { textDocument: { uri: 'file:///nowhere/x.md' }, position: { line: 0, character: 0 } });
    assert.equal(hover, null);
    const uri = uriOf(path.join(root, 'm.md'));
    client.open(uri, MATERIAL);
    await client.waitForDiagnostics(uri, () => true);
  });

  it('follows data files on disk through watched-file events', async () => {
    root = tempNotebook({ 'm.md': MATERIAL + DEPOSITION, 'r.md': '```ramp R-1\nfilm: D-1\nrate: 10 K/min\ndata: r.csv\n```\n' });
    client = await startServer(root);
    const uri = uriOf(path.join(root, 'r.md'));
    await client.waitForDiagnostics(uri, (d) => d.some((x) => x.code === 'data.missing-file'));
    fs.writeFileSync(path.join(root, 'r.csv'), 'T/K, h/nm\n300, 100\n301, x\n');
    client.connection.sendNotification('workspace/didChangeWatchedFiles', { changes: [{ uri: uriOf(path.join(root, 'r.csv')), type: 1 }] });
    await client.waitForDiagnostics(uri, (d) => d.some((x) => x.code === 'table.bad-cell') && !d.some((x) => x.code === 'data.missing-file'));
  });

  it('takes a quick fix from the text as it is when the fix is asked for, not as it was when published', async () => {
    const text = MATERIAL + '\n' + DEPOSITION.replace('substrate_temperature: 255 K', 'substrate_temperature: 255');
    root = tempNotebook({ 'd.md': text });
    client = await startServer(root);
    const uri = uriOf(path.join(root, 'd.md'));
    client.open(uri, text);
    const bare = (await client.waitForDiagnostics(uri, (d) => d.some((x) => x.code === 'quantity.bare-number'))).find((d) => d.code === 'quantity.bare-number')!;
    // A line typed above the block: the editor moves the diagnostic down with the text.
    const edited = 'A note typed above.\n' + text;
    client.change(uri, edited, 2);
    const moved = { ...bare, range: { start: { ...bare.range.start, line: bare.range.start.line + 1 }, end: { ...bare.range.end, line: bare.range.end.line + 1 } } };
    const actions: CodeAction[] = await client.connection.sendRequest('textDocument/codeAction', { textDocument: { uri }, range: moved.range, context: { diagnostics: [moved] } });
    const fix = actions.find((a) => a.title === 'Write the unit: 255 K');
    assert.ok(fix, actions.map((a) => a.title).join(', '));
    assert.equal(applyEdits(edited, editsFor(fix.edit, uri)), edited.replace('substrate_temperature: 255\n', 'substrate_temperature: 255 K\n'));
    // The range as published no longer holds that diagnostic: no edit is offered there.
    const stale: CodeAction[] = await client.connection.sendRequest('textDocument/codeAction', { textDocument: { uri }, range: bare.range, context: { diagnostics: [bare] } });
    assert.ok(!stale.some((a) => a.title === 'Write the unit: 255 K'));
  });

  it('forgets what lay in a folder deleted on disk, told by one event for the folder', async () => {
    root = tempNotebook({
      'm.md': MATERIAL + DEPOSITION,
      'days/r.md': '```ramp R-1\nfilm: D-1\nrate: 10 K/min\ndata: r.csv\n```\n',
      'days/o.csv': 'T/K, h/nm\n300, 100\n301, x\n',
      'o.md': '```ramp R-2\nfilm: D-1\nrate: 10 K/min\ndata: days/o.csv\n```\n',
    });
    client = await startServer(root);
    const inside = uriOf(path.join(root, 'days', 'r.md'));
    const outside = uriOf(path.join(root, 'o.md'));
    await client.waitForDiagnostics(inside, (d) => d.some((x) => x.code === 'data.missing-file'));
    await client.waitForDiagnostics(outside, (d) => d.some((x) => x.code === 'table.bad-cell'));
    fs.rmSync(path.join(root, 'days'), { recursive: true });
    client.connection.sendNotification('workspace/didChangeWatchedFiles', { changes: [{ uri: uriOf(path.join(root, 'days')), type: 3 }] });
    await client.waitForDiagnostics(inside, (d) => d.length === 0);
    await client.waitForDiagnostics(outside, (d) => d.some((x) => x.code === 'data.missing-file'));
  });
});
