/** Entry point of the `vitrine` executable. */
import { runCli } from './main.js';

process.exitCode = await runCli(process.argv.slice(2), {
  out: (t) => process.stdout.write(t),
  err: (t) => process.stderr.write(t),
  cwd: process.cwd(),
  errIsTty: process.stderr.isTTY === true,
});
