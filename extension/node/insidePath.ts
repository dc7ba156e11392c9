/** Whether a path lies inside a folder, by whole path segments (`..x.csv` is inside; `../x` is not). */
import * as path from 'node:path';

export function isInside(folder: string, target: string): boolean {
  const rel = path.relative(folder, target);
  if (rel === '') return true;
  if (path.isAbsolute(rel)) return false;
  return rel.split(path.sep)[0] !== '..';
}
