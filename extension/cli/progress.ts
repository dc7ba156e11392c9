/** A progress bar on standard error, drawn only on a terminal and only for many files. */
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
      const name = what.length > 40 ? '…' + what.slice(-39) : what;
      write(`\r[${'#'.repeat(filled)}${' '.repeat(width - filled)}] ${done}/${total} ${name.padEnd(40)}`);
      drawn = true;
    },
    done() {
      if (drawn) write('\r' + ' '.repeat(80) + '\r');
      drawn = false;
    },
  };
}
