/**
 * `vitrine-language-server --stdio`: the entry of the server bundle. Any LSP editor can start it.
 */
import * as fs from 'node:fs';
import * as path from 'node:path';
import { pathToFileURL } from 'node:url';
import { createConnection, ProposedFeatures } from 'vscode-languageserver/node';
import { setCodesHref } from './diagnostics.js';
import { VitrineServer } from './server.js';

/** The README beside the bundle (in the package) or at the repository root: where the codes are listed. */
function readmeHref(): string | null {
  const here = typeof __dirname === 'string' ? __dirname : path.dirname(process.argv[1] ?? '.');
  for (const candidate of [path.join(here, '..', 'README.md'), path.join(here, '..', 'readme.md'), path.join(here, 'README.md')]) {
    if (fs.existsSync(candidate)) return `${pathToFileURL(candidate).href}#diagnostic-codes`;
  }
  return null;
}

if (process.argv.includes('--version')) {
  process.stdout.write('vitrine-language-server 0.1.0\n');
  process.exit(0);
}

setCodesHref(readmeHref());
const connection = createConnection(ProposedFeatures.all);
const server = new VitrineServer(connection);
server.listen();
process.on('uncaughtException', (e) => server.log(`uncaught: ${e instanceof Error ? (e.stack ?? e.message) : String(e)}`));
process.on('unhandledRejection', (e) => server.log(`unhandled: ${e instanceof Error ? (e.stack ?? e.message) : String(e)}`));
connection.listen();
