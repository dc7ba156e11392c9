/**
 * A progress bar on standard error, drawn only on a terminal and only for many files. It writes
 * its own carriage returns; the file name in it is shown with control characters escaped.
 */
import { terminalText } from './terminalText.js';

export interface Progress {
  update(done: number, total: number, what: string): void;
  done(): void;
}

export function progressBar(write: (text: string) => void, minimum = 20): Progress {
  let drawn = false;
  return {
    update(done, total, what) {
      if (total < minimum) return;
      const width = 30;
      const filled = Math.round((width * done) / total);
      const safe = terminalText(what);
      const name = safe.length > 40 ? '…' + safe.slice(-39) : safe;
      write(`\r[${'#'.repeat(filled)}${' '.repeat(width - filled)}] ${done}/${total} ${name.padEnd(40)}`);
      drawn = true;
    },
    done() {
      if (drawn) write('\r' + ' '.repeat(80) + '\r');
      drawn = false;
    },
  };
}
