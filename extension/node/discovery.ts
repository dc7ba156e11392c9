/** Which files make a notebook: the markdown files below its root. */
import * as fs from 'node:fs';
import * as path from 'node:path';

const SKIP_DIRS = new Set(['node_modules', '.git', 'dist', 'out']);

/** Every markdown file below a root, root-relative with `/`, sorted. Hidden folders are skipped. */
export function markdownFiles(root: string): string[] {
  const out: string[] = [];
  const walk = (dir: string, rel: string): void => {
    let entries: fs.Dirent[];
    try {
      entries = fs.readdirSync(dir, { withFileTypes: true });
    } catch {
      return;
    }
    for (const e of entries) {
      if (e.name.startsWith('.')) continue;
      const childRel = rel ? `${rel}/${e.name}` : e.name;
      if (e.isDirectory()) {
        if (!SKIP_DIRS.has(e.name)) walk(path.join(dir, e.name), childRel);
      } else if (e.isFile() && /\.(md|markdown)$/i.test(e.name)) {
        out.push(childRel);
      }
    }
  };
  walk(root, '');
  return out.sort();
}
