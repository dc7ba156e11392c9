/** Finding a block's report and text position from an LSP request. */
import type { Position } from 'vscode-languageserver';
import type { BlockLocation, BlockReport } from '../core/index.js';
import type { DocumentText } from './documentText.js';
import type { Place, Workspace } from './workspace.js';

export interface At {
  readonly place: Place;
  readonly text: DocumentText;
  readonly offset: number;
}

/** The place, text and engine offset of a request's position. */
export function at(ws: Workspace, uri: string, position: Position): At | null {
  const place = ws.placeOf(uri);
  const text = ws.textOf(uri);
  if (!place || !text) return null;
  return { place, text, offset: text.offset(position) };
}

/** The current report of a located block (analysed on demand; the engine's caches make it cheap). */
export function reportOf(place: Place, block: BlockLocation): BlockReport | undefined {
  const file = place.folder.engine.analyze({ only: [block.path] }).files[0];
  return file?.blocks.find((b) => b.span.start === block.span.start);
}
