/** Entry point of the `vitrine` executable. */
import { runCli } from './main.js';
import { sourceDateClock } from './sourceDate.js';

// A reproducible report date (reproducible-builds.org's SOURCE_DATE_EPOCH), when it is a valid one.
const now = sourceDateClock(process.env.SOURCE_DATE_EPOCH, (t) => process.stderr.write(t));

// A reader that stops early (`vitrine analyze --json | head`) closes the pipe: the run ends there
// with the status a shell gives a command cut off that way (128 + SIGPIPE), not a stack trace.
for (const stream of [process.stdout, process.stderr]) {
  stream.on('error', (e: NodeJS.ErrnoException) => {
    if (e.code === 'EPIPE') process.exit(141);
    throw e;
  });
}

void runCli(process.argv.slice(2), {
  out: (t) => process.stdout.write(t),
  err: (t) => process.stderr.write(t),
  cwd: process.cwd(),
  errIsTty: process.stderr.isTTY === true,
  ...(now ? { now } : {}),
}).then((code) => {
  process.exitCode = code;
});
