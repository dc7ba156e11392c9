/** Runs the CLI in-process from the repository root and collects what it prints. */
import { runCli } from '../../extension/cli/main.js';
import { REPO } from './loadNotebook.js';

export async function run(args: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const code = await runCli(args, { out: (t) => (out += t), err: (t) => (err += t), cwd: REPO });
  return { code, out, err };
}
