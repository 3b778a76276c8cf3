/** What the engine's command-line tools share: reading the input file and their exit codes. */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { EngineInputError } from '../../../shared/domain';

/** A mistake in the command line or its input: exit status 2 with one message. */
export class UsageError extends Error {}

/** Reads a text file named on the command line, from the folder where the command was typed. */
export function readInputFile(file: string): string {
  try {
    // `npm run` starts scripts in the project folder; INIT_CWD is where the engineer typed the command.
    return readFileSync(resolve(process.env.INIT_CWD ?? process.cwd(), file), 'utf8');
  } catch (error) {
    throw new UsageError(`cannot read ${file}: ${(error as NodeJS.ErrnoException).code ?? String(error)}`);
  }
}

/**
 * Runs a tool's `main`: bad input or unusable data → one line on stderr and exit 2, nothing on
 * stdout; anything else is a fault of the tool itself → exit 1 with its stack.
 */
export function runCli(name: string, main: (argv: string[]) => void): void {
  try {
    main(process.argv.slice(2));
  } catch (error) {
    if (error instanceof UsageError || error instanceof EngineInputError) {
      process.stderr.write(`${name}: ${error.message}\n`);
      process.exit(2);
    }
    const code = (error as { code?: unknown }).code;
    if (typeof code === 'string' && code.startsWith('ERR_PARSE_ARGS')) {
      process.stderr.write(`${name}: ${(error as Error).message.split('\n')[0]} (see --help)\n`);
      process.exit(2);
    }
    process.stderr.write(
      `${name}: unexpected error: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`,
    );
    process.exit(1);
  }
}
