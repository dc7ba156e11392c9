/** Which files make a notebook: the markdown files below its root. */
import * as fs from 'node:fs';
import * as path from 'node:path';

/** Tool folders, never notebook content: hidden folders (`.git`, `.vscode`) and installed packages. */
function isToolFolder(name: string): boolean {
  return name.startsWith('.') || name === 'node_modules';
}

/**
 * Files below a root whose name `accept`s, root-relative with `/`, sorted; tool folders and
 * hidden files are skipped, and so is anything deeper than `maxDepth` folders. Symbolic links
 * are not followed (a link to a folder could lead outside the root or into a loop). The tool
 * folders skipped are added, root-relative, to `skipped` when it is given.
 */
export function filesBelow(root: string, accept: (name: string) => boolean, maxDepth = Infinity, skipped?: string[]): string[] {
  const out: string[] = [];
  const walk = (dir: string, rel: string, depth: number): void => {
    let entries: fs.Dirent[];
    try {
      entries = fs.readdirSync(dir, { withFileTypes: true });
    } catch {
      return;
    }
    for (const e of entries) {
      const childRel = rel ? `${rel}/${e.name}` : e.name;
      if (e.isDirectory() && isToolFolder(e.name)) {
        skipped?.push(childRel);
        continue;
      }
      if (e.name.startsWith('.')) continue;
      if (e.isDirectory()) {
        if (depth < maxDepth) walk(path.join(dir, e.name), childRel, depth + 1);
      } else if (e.isFile() && accept(e.name)) {
        out.push(childRel);
      }
    }
  };
  walk(root, '', 0);
  skipped?.sort();
  return out.sort();
}

/** Every markdown file below a root; the tool folders skipped go into `skipped` when it is given. */
export function markdownFiles(root: string, skipped?: string[]): string[] {
  return filesBelow(root, (name) => /\.(md|markdown)$/i.test(name), Infinity, skipped);
}
