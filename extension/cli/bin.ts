/** Entry point of the `vitrine` executable. */
import { runCli } from './main.js';

const code = runCli(process.argv.slice(2), {
  out: (t) => process.stdout.write(t),
  err: (t) => process.stderr.write(t),
  cwd: process.cwd(),
});
process.exitCode = code;
