// Writes dist/vitrine-<version>.vsix from the release bundles (run after `build.mjs --release`).
// vsce runs offline: no dependencies are packed (everything is bundled), no repository is needed.
import { execFileSync } from 'node:child_process';
import * as fs from 'node:fs';

const { version } = JSON.parse(fs.readFileSync('package.json', 'utf8'));
fs.mkdirSync('dist', { recursive: true });
const out = `dist/vitrine-${version}.vsix`;
execFileSync(process.execPath, ['node_modules/@vscode/vsce/vsce', 'package', '--no-dependencies', '--allow-missing-repository', '--no-rewrite-relative-links', '-o', out], { stdio: 'inherit' });
const size = fs.statSync(out).size;
console.log(`${out}: ${(size / 2 ** 20).toFixed(2)} MiB`);
if (size > 5 * 2 ** 20) {
  console.error('the package is larger than 5 MiB');
  process.exit(1);
}
