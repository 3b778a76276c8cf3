/**
 * Helpers for tests that run Ebbline as a separate process (the server, the start command):
 * free ports, a child process whose output is kept for the failure message, and waits on state.
 */
import { spawn, type ChildProcess, type SpawnOptions } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';

/**
 * Loopback ports that were free a moment ago, all different (the OS picks them; all are held
 * until the last is picked, so two calls cannot get the same one). Pass them on at once.
 */
export async function freePorts(count: number): Promise<number[]> {
  const servers = Array.from({ length: count }, () => net.createServer());
  await Promise.all(
    servers.map((server) => new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve))),
  );
  const ports = servers.map((server) => (server.address() as net.AddressInfo).port);
  await Promise.all(
    servers.map((server) => new Promise<void>((resolve) => server.close(() => resolve()))),
  );
  return ports;
}

/** One loopback port that was free a moment ago. */
export async function freePort(): Promise<number> {
  const [port] = await freePorts(1);
  return port!;
}

export interface RunningProcess {
  child: ChildProcess;
  /** Everything it wrote so far, stdout and stderr interleaved (for failure messages). */
  output(): string;
  /** Resolves with the exit code (or signal name) once it has ended. */
  exited: Promise<number | string>;
  /** True until it has ended. */
  alive(): boolean;
}

/** Spawns `command` with its output kept in memory rather than mixed into the test's. */
export function startProcess(
  command: string,
  args: string[],
  options: SpawnOptions,
): RunningProcess {
  const child = spawn(command, args, { ...options, stdio: ['ignore', 'pipe', 'pipe'] });
  let output = '';
  child.stdout?.on('data', (chunk: Buffer) => (output += chunk.toString()));
  child.stderr?.on('data', (chunk: Buffer) => (output += chunk.toString()));
  let ended = false;
  const exited = new Promise<number | string>((resolve) =>
    child.once('exit', (code, signal) => {
      ended = true;
      resolve(code ?? signal ?? 'unknown');
    }),
  );
  return { child, output: () => output, exited, alive: () => !ended };
}

/**
 * Polls `check` until it returns a value other than undefined/false and returns that value;
 * the timeout is only a ceiling for a busy machine. A thrown error counts as "not yet".
 * @throws naming `what` and the last error seen, once `timeoutMs` has passed
 */
export async function waitUntil<T>(
  check: () => T | undefined | false | Promise<T | undefined | false>,
  { timeoutMs, what, intervalMs = 50 }: { timeoutMs: number; what: string; intervalMs?: number },
): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  let last: unknown;
  for (;;) {
    try {
      const value = await check();
      if (value !== undefined && value !== false) return value;
    } catch (err) {
      last = err;
    }
    if (Date.now() > deadline) {
      throw new Error(
        `${what}: not reached within ${timeoutMs} ms${last ? ` (last error: ${String(last)})` : ''}`,
      );
    }
    await new Promise((resolve) => setTimeout(resolve, intervalMs));
  }
}

/** True when a process with this pid still exists (zombies awaiting their parent count as gone). */
export function processExists(pid: number): boolean {
  try {
    process.kill(pid, 0);
  } catch {
    return false;
  }
  try {
    const stat = fs.readFileSync(`/proc/${pid}/stat`, 'utf8');
    return stat.slice(stat.lastIndexOf(')') + 2, stat.lastIndexOf(')') + 3) !== 'Z';
  } catch {
    return false;
  }
}
