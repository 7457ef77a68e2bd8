/**
 * The parent's side: starts a worker script of this folder as a real child process
 * (`node --import tsx`), reads its stdout line by line, and can wait for a line, talk on
 * its stdin, and SIGKILL it.
 */
import { spawn, type ChildProcessWithoutNullStreams } from 'node:child_process';
import { createInterface } from 'node:readline';
import { fileURLToPath } from 'node:url';

const REPO_ROOT = fileURLToPath(new URL('../../..', import.meta.url));

/** How a child ended. */
export interface WorkerExit {
  code: number | null;
  signal: NodeJS.Signals | null;
  /** Every stdout line it wrote, in order. */
  lines: string[];
  stderr: string;
}

/** A running child. */
export interface Worker {
  readonly pid: number;
  /** The stdout lines read so far. */
  readonly lines: readonly string[];
  /** Resolves with the first line (already read or still to come) that `match` accepts. */
  waitForLine(match: (line: string) => boolean, timeoutMs?: number): Promise<string>;
  /** Writes a last line to the child's stdin and closes it. */
  sendAndClose(line: string): void;
  /** Sends SIGKILL to this child, by its process id. */
  kill(): void;
  /** Resolves once the child has exited and its stdout and stderr are fully read. */
  readonly exited: Promise<WorkerExit>;
}

const DEFAULT_WAIT_MS = 20_000;

/** Children started and not yet exited, so a failed test leaves none running. */
const running = new Set<Worker>();

/** SIGKILLs every child this module started that is still running (each by its own id). */
export function killRunningWorkers(): void {
  for (const worker of running) worker.kill();
}

/**
 * Starts `test/db/_workers/<script>` in a new Node process.
 *
 * @param script - file name in this folder, e.g. `crash-writer.ts`
 * @param args - its arguments
 * @returns the running child
 */
export function startWorker(script: string, args: readonly string[]): Worker {
  const path = fileURLToPath(new URL(script, import.meta.url));
  const child: ChildProcessWithoutNullStreams = spawn(
    process.execPath,
    ['--import', 'tsx', path, ...args],
    { cwd: REPO_ROOT, stdio: 'pipe' },
  );
  const lines: string[] = [];
  const waiters: { match: (line: string) => boolean; resolve: (line: string) => void }[] = [];
  let stderr = '';
  child.stderr.setEncoding('utf8');
  child.stderr.on('data', (chunk: string) => {
    stderr += chunk;
  });
  const reader = createInterface({ input: child.stdout });
  reader.on('line', (line) => {
    lines.push(line);
    for (const waiter of [...waiters]) {
      if (waiter.match(line)) {
        waiters.splice(waiters.indexOf(waiter), 1);
        waiter.resolve(line);
      }
    }
  });
  const stdoutClosed = new Promise<void>((resolve) => reader.on('close', resolve));
  const stderrClosed = new Promise<void>((resolve) => child.stderr.on('close', resolve));
  const processExited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>(
    (resolve) => child.on('exit', (code, signal) => resolve({ code, signal })),
  );
  const exited = Promise.all([processExited, stdoutClosed, stderrClosed]).then(([status]) => ({
    ...status,
    lines,
    stderr,
  }));
  // A child that dies early must not leave a waiter hanging until the test times out.
  child.stdin.on('error', () => undefined);

  const worker: Worker = {
    pid: child.pid ?? -1,
    lines,
    waitForLine(match, timeoutMs = DEFAULT_WAIT_MS) {
      const seen = lines.find(match);
      if (seen !== undefined) return Promise.resolve(seen);
      return new Promise<string>((resolve, reject) => {
        const timer = setTimeout(() => {
          reject(
            new Error(`no matching line from ${script} in ${timeoutMs} ms; stderr: ${stderr}`),
          );
        }, timeoutMs);
        const waiter = {
          match,
          resolve: (line: string) => {
            clearTimeout(timer);
            resolve(line);
          },
        };
        waiters.push(waiter);
        void exited.then(() => {
          if (!waiters.includes(waiter)) return;
          clearTimeout(timer);
          reject(new Error(`${script} exited before the line came; stderr: ${stderr}`));
        });
      });
    },
    sendAndClose(line) {
      child.stdin.end(`${line}\n`);
    },
    kill() {
      child.kill('SIGKILL');
    },
    exited,
  };
  running.add(worker);
  void exited.then(() => running.delete(worker));
  return worker;
}

/**
 * Resolves after `milliseconds`.
 *
 * @param milliseconds - the delay, ms
 */
export function delay(milliseconds: number): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, milliseconds));
}
