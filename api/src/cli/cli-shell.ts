/**
 * What the engine's command-line tools share: their streams, reading the input file, and their
 * exit codes. Each tool exports `main(argv, io)`, which returns its exit code instead of ending
 * the process, so tests run it in-process and only the entry point touches `process`.
 */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { EngineInputError } from '../../../shared/domain';

/** A mistake in the command line or its input: exit status 2 with one message. */
export class UsageError extends Error {}

/** Where a tool's text goes: `process.stdout`, a stream, or a collector in a test. */
export interface TextSink {
  write(text: string): unknown;
}

/** A tool's streams and folder; every part defaults to the running process's own. */
export interface CliIo {
  stdout: TextSink;
  stderr: TextSink;
  /** Standard input as text, read when the file argument is `-` (default: the process's stdin). */
  stdin: string | (() => string);
  /** The folder relative file names are read from (default: where the command was typed). */
  cwd: string;
}

/** A tool's entry: arguments (without `node` and the script) and optional streams → exit code. */
export type CliMain = (argv: readonly string[], io?: Partial<CliIo>) => number;

/** Exit statuses of the tools: 0 done, 1 a fault of the tool itself, 2 bad input or unusable data. */
export const EXIT = { ok: 0, fault: 1, usage: 2 } as const;

function processIo(): CliIo {
  return {
    stdout: process.stdout,
    stderr: process.stderr,
    stdin: () => readFileSync(0, 'utf8'),
    // `npm run` starts scripts in the project folder; INIT_CWD is where the engineer typed the command.
    cwd: process.env.INIT_CWD ?? process.cwd(),
  };
}

/**
 * Reads the text file named on the command line, relative to `io.cwd`; `-` reads standard input.
 *
 * @throws UsageError naming the file when it cannot be read.
 */
export function readInputFile(file: string, io: Pick<CliIo, 'stdin' | 'cwd'>): string {
  try {
    if (file === '-') return typeof io.stdin === 'string' ? io.stdin : io.stdin();
    return readFileSync(resolve(io.cwd, file), 'utf8');
  } catch (error) {
    throw cannotRead(file, error);
  }
}

/**
 * Reads the file named on the command line as bytes, for readers that decode it themselves (a
 * logger's export in UTF-16 or Latin-1); `-` reads standard input as text, passed on as UTF-8.
 *
 * @throws UsageError naming the file when it cannot be read.
 */
export function readInputBytes(file: string, io: Pick<CliIo, 'stdin' | 'cwd'>): Uint8Array {
  if (file === '-') return new TextEncoder().encode(readInputFile(file, io));
  try {
    return readFileSync(resolve(io.cwd, file));
  } catch (error) {
    throw cannotRead(file, error);
  }
}

function cannotRead(file: string, error: unknown): UsageError {
  return new UsageError(
    `cannot read ${file === '-' ? 'standard input' : file}: ${(error as NodeJS.ErrnoException).code ?? String(error)}`,
  );
}

/**
 * Wraps a tool's body into its `main`: bad input or unusable data → one line on stderr and exit
 * 2, nothing on stdout; anything else is a fault of the tool itself → exit 1 with its stack.
 *
 * @param name the tool's name, the prefix of its messages ("fit: …").
 * @param body does the work and writes its answer to `io.stdout`; throws on failure.
 */
export function defineCli(name: string, body: (argv: string[], io: CliIo) => void): CliMain {
  return (argv, io = {}) => {
    const streams: CliIo = { ...processIo(), ...io };
    try {
      body([...argv], streams);
      return EXIT.ok;
    } catch (error) {
      if (error instanceof UsageError || error instanceof EngineInputError) {
        streams.stderr.write(`${name}: ${error.message}\n`);
        return EXIT.usage;
      }
      const code = (error as { code?: unknown }).code;
      if (typeof code === 'string' && code.startsWith('ERR_PARSE_ARGS')) {
        streams.stderr.write(`${name}: ${(error as Error).message.split('\n')[0]} (see --help)\n`);
        return EXIT.usage;
      }
      streams.stderr.write(
        `${name}: unexpected error: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`,
      );
      return EXIT.fault;
    }
  };
}

/**
 * Runs `main` with the process's arguments when the module at `moduleUrl` is the script being
 * run (`tsx api/src/cli/fit.ts`), and does nothing when it is imported (tests). Sets
 * `process.exitCode` rather than calling `process.exit`, so piped output is written in full.
 */
export function runIfEntryPoint(moduleUrl: string, main: CliMain): void {
  const script = process.argv[1];
  if (script === undefined || resolve(script) !== fileURLToPath(moduleUrl)) return;
  process.exitCode = main(process.argv.slice(2));
}
