/**
 * Runs the command line in-process with captured output, and writes home files to a
 * temporary folder for it to read.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main, type CliOutput } from '../../electron/cli.ts';

/** What one run of the command line produced. */
export interface CliRun {
  exitCode: number;
  stdout: string;
  stderr: string;
}

/**
 * Runs `main(argv)` with an output that records what it writes.
 *
 * @param argv - the arguments after the program name
 * @returns the exit code and everything written to stdout and stderr
 */
export async function runCli(argv: readonly string[]): Promise<CliRun> {
  const outChunks: string[] = [];
  const errChunks: string[] = [];
  const output: CliOutput = {
    out: (text) => void outChunks.push(text.endsWith('\n') ? text : `${text}\n`),
    err: (text) => void errChunks.push(text.endsWith('\n') ? text : `${text}\n`),
  };
  const exitCode = await main(argv, output);
  return { exitCode, stdout: outChunks.join(''), stderr: errChunks.join('') };
}

/** A temporary folder under the OS temp folder, and a way to put files in it. */
export interface TempFolder {
  path: string;
  /** Writes `text` (or the JSON of a value) to `name` in the folder; returns the file's path. */
  write(name: string, content: unknown): string;
  remove(): void;
}

/**
 * Makes a fresh folder under the OS temporary folder.
 *
 * @param prefix - start of the folder's name
 * @returns the folder, with `write` and `remove`
 */
export function makeTempFolder(prefix = 'sealwork-test-'): TempFolder {
  const path = mkdtempSync(join(tmpdir(), prefix));
  return {
    path,
    write(name, content) {
      const file = join(path, name);
      writeFileSync(file, typeof content === 'string' ? content : JSON.stringify(content, null, 2));
      return file;
    },
    remove() {
      rmSync(path, { recursive: true, force: true });
    },
  };
}
