/** Runs a command-line tool's `main` in-process, collecting what it writes, as a shell would see it. */
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import type { CliIo, CliMain } from '../../api/src/cli/cli-shell';

/** The project folder: where `npm run` runs the tools. */
export const PROJECT_ROOT = join(import.meta.dirname, '..', '..');

/** What a run of a tool left behind. */
export interface CliResult {
  status: number;
  stdout: string;
  stderr: string;
}

/**
 * Calls `main(argv)` with collecting streams, reading relative files from the project folder.
 *
 * @param io overrides, e.g. `{ stdin: 'date,ratio\n…' }` for a file argument of `-`.
 */
export function runInProcess(
  main: CliMain,
  argv: readonly string[],
  io: Partial<Pick<CliIo, 'stdin' | 'cwd'>> = {},
): CliResult {
  let stdout = '';
  let stderr = '';
  const status = main(argv, {
    stdout: { write: (text: string) => (stdout += text) },
    stderr: { write: (text: string) => (stderr += text) },
    stdin: '',
    cwd: PROJECT_ROOT,
    ...io,
  });
  return { status, stdout, stderr };
}

/**
 * Runs `npm run -s <script> -- …argv` as an engineer types it, in a new process: the one smoke
 * test per tool that the real entry point, `tsx` and the exit status hold together.
 */
export function runAsUser(script: string, argv: readonly string[]): CliResult {
  const result = spawnSync('npm', ['run', '-s', script, '--', ...argv], {
    cwd: PROJECT_ROOT,
    encoding: 'utf8',
    // Starting npm and tsx on a busy machine can take many seconds; this is a ceiling, not a measure.
    timeout: 120_000,
  });
  if (result.error) throw result.error;
  return { status: result.status ?? -1, stdout: result.stdout, stderr: result.stderr };
}
