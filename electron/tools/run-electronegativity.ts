/**
 * The electronegativity gate: Doyensec's scanner on the main-process sources, failing on
 * every HIGH or MEDIUM finding that electronegativity-explained.json does not accept with a
 * reason, on every file the scanner could not read, and on every explanation that no longer
 * matches a finding. `npm run lint:electron` runs it; so does the test suite.
 *
 * Two faults of the 1.10.3 command line decide how it is called. With `-o report.csv` it
 * writes the header and the rows with two concurrent asynchronous writes, so the header can
 * land over the first row (one run in 16 lost its first finding here, under load); and with
 * `-o` it drops, without a word, every file it failed to parse. So the gate calls the
 * package's programmatic entry (its `main`, documented in its README) in a child Node
 * process, with the options the flags `-e VERSION -x AvailableSecurityFixesGlobalCheck -r`
 * stand for, and reads findings and parse errors as JSON. The README names the version
 * option `electronVersion`, but the runner reads `electronVersionOverride`; the test checks
 * that the version really arrives.
 */
import { execFile } from 'node:child_process';
import { readdirSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, extname, join, relative, resolve, sep } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { parseArgs } from 'node:util';
import { z } from 'zod';

const PROJECT_ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '..', '..');
export const DEFAULT_EXPLANATIONS = join(
  PROJECT_ROOT,
  'electron',
  'tools',
  'electronegativity-explained.json',
);

/** Severities that fail the gate unless explained. */
const GATED_SEVERITIES: readonly string[] = ['HIGH', 'MEDIUM'];
/** Extensions the scanner's directory loader skips (it reads js, jsx, ts, tsx, html, htm). */
const UNSCANNED_EXTENSIONS: readonly string[] = ['.cjs', '.mjs', '.cts', '.mts'];
/** Marks the child's JSON line among whatever else the scanner prints. */
const RESULT_MARKER = 'SEALWORK-SCAN-RESULT ';

const findingSchema = z.strictObject({
  checkId: z.string(),
  severity: z.string(),
  confidence: z.string(),
  file: z.string(),
  line: z.int(),
  column: z.int(),
  sample: z.string().nullable(),
  description: z.string(),
  manualReview: z.boolean(),
});
export type ScannerFinding = z.output<typeof findingSchema>;

const childResultSchema = z.strictObject({
  issues: z.array(findingSchema),
  errors: z.array(
    z.strictObject({ file: z.string(), message: z.string(), tolerable: z.boolean() }),
  ),
});

const explanationSchema = z.strictObject({
  checkId: z.string().regex(/^[A-Z][A-Z0-9_]+$/),
  /** Relative to the scanned folder, as the scanner prints it; "N/A" for its global checks. */
  file: z.string().min(1),
  /** The code line the finding points at, whitespace collapsed; "" for a global check. */
  sample: z.string(),
  /** `false-positive`: the scanner is wrong here; `reviewed`: a review prompt, reviewed;
   * `accepted-risk`: a real gap, judged acceptable for now, with its fix named. */
  verdict: z.enum(['false-positive', 'reviewed', 'accepted-risk']),
  reason: z.string().min(40, 'a reason of at least a sentence'),
  checkedBy: z.string().min(1).optional(),
});
export type Explanation = z.output<typeof explanationSchema>;

const explanationsFileSchema = z.strictObject({
  $comment: z.string().optional(),
  accepted: z.array(explanationSchema),
});

/** The child program: stubs the scanner's translation download, runs it, prints JSON. */
const CHILD_PROGRAM = `
const Module = require('node:module');
const input = JSON.parse(process.argv[process.argv.length - 1]);
// The scanner fetches fresh translations on every run; the gate stays offline (English ships).
const offline = new Module(input.gotPath);
offline.exports = () => Promise.reject(new Error('offline'));
offline.loaded = true;
require.cache[input.gotPath] = offline;
require(input.runnerPath)(input.options).then((result) => {
  const issues = result.issues.map((i) => ({
    checkId: i.id, severity: i.severity.name, confidence: i.confidence.name, file: i.file,
    line: i.location.line, column: i.location.column, sample: i.sample == null ? null : i.sample,
    description: i.description, manualReview: Boolean(i.manualReview),
  }));
  process.stdout.write('\\n${RESULT_MARKER}' + JSON.stringify({ issues, errors: result.errors }) + '\\n');
}, (error) => {
  process.stderr.write(String((error && error.stack) || error));
  process.exitCode = 1;
});
`;

/** The Electron version installed in node_modules (read from its package.json, never loaded). */
export function installedElectronVersion(projectRoot: string = PROJECT_ROOT): string {
  const text = readFileSync(join(projectRoot, 'node_modules', 'electron', 'package.json'), 'utf8');
  return z.object({ version: z.string() }).parse(JSON.parse(text)).version;
}

function filesUnder(folder: string): string[] {
  return readdirSync(folder, { recursive: true, encoding: 'utf8' })
    .filter((name) => !name.split(sep).includes('node_modules'))
    .map((name) => join(folder, name));
}

/** Whitespace-collapsed code line: the line-independent part of a finding's identity. */
export function normalizedSample(sample: string | null): string {
  return (sample ?? '').replace(/\s+/g, ' ').trim();
}

function keyOf(entry: { checkId: string; file: string; sample: string | null }): string {
  return `${entry.checkId}|${entry.file}|${normalizedSample(entry.sample)}`;
}

/**
 * Scans one folder with electronegativity.
 *
 * @param options.inputFolder - the folder to scan (absolute or relative to the working folder)
 * @param options.electronVersion - the Electron version the scanner assumes (its `-e`)
 * @param options.timeoutMs - how long the scanner may run, in milliseconds
 * @returns the scanner's findings (file paths relative to the folder), plus one finding of
 *   its own kind for each file the scanner could not parse (`GATE_UNPARSED_FILE`, HIGH) and
 *   each file of an extension it skips (`GATE_UNSCANNED_FILE`, MEDIUM)
 */
export async function scanFolder(options: {
  inputFolder: string;
  electronVersion: string;
  timeoutMs?: number;
}): Promise<ScannerFinding[]> {
  const input = resolve(options.inputFolder);
  const requireHere = createRequire(import.meta.url);
  const runnerPath = requireHere.resolve('@doyensec/electronegativity');
  const gotPath = createRequire(runnerPath).resolve('got');
  const request = {
    runnerPath,
    gotPath,
    options: {
      input,
      isRelative: true,
      electronVersionOverride: options.electronVersion,
      excludeFromScan: ['availablesecurityfixesglobalcheck'],
    },
  };
  const stdout = await new Promise<string>((done, fail) => {
    execFile(
      process.execPath,
      ['--input-type=commonjs', '-e', CHILD_PROGRAM, JSON.stringify(request)],
      { timeout: options.timeoutMs ?? 120_000, maxBuffer: 64 * 1024 * 1024 },
      (error, out, err) =>
        error ? fail(new Error(`electronegativity failed: ${err || error.message}`)) : done(out),
    );
  });
  const line = stdout.split('\n').find((text) => text.startsWith(RESULT_MARKER));
  if (line === undefined) throw new Error(`electronegativity printed no result:\n${stdout}`);
  const result = childResultSchema.parse(JSON.parse(line.slice(RESULT_MARKER.length)));
  const own = (file: string) => relative(input, file).split(sep).join('/');
  const unparsed: ScannerFinding[] = result.errors
    .filter((error) => !error.tolerable)
    .map((error) => ({
      checkId: 'GATE_UNPARSED_FILE',
      severity: 'HIGH',
      confidence: 'CERTAIN',
      file: own(error.file),
      line: 0,
      column: 0,
      sample: null,
      description: `the scanner could not parse this file, so none of its checks ran on it (${error.message})`,
      manualReview: true,
    }));
  const unscanned: ScannerFinding[] = filesUnder(input)
    .filter((file) => UNSCANNED_EXTENSIONS.includes(extname(file)))
    .map((file) => ({
      checkId: 'GATE_UNSCANNED_FILE',
      severity: 'MEDIUM',
      confidence: 'CERTAIN',
      file: own(file),
      line: 0,
      column: 0,
      sample: null,
      description: 'the scanner skips files with this extension; none of its checks ran on it',
      manualReview: true,
    }));
  return [
    ...result.issues.map((issue) => ({ ...issue, file: issue.file.split(sep).join('/') })),
    ...unparsed,
    ...unscanned,
  ];
}

/**
 * Reads and checks the explanations file.
 *
 * @param path - the JSON file
 * @returns its entries
 * @throws when an entry lacks a field, a verdict or a reason of at least a sentence
 */
export function loadExplanations(path: string = DEFAULT_EXPLANATIONS): Explanation[] {
  const parsed = explanationsFileSchema.safeParse(JSON.parse(readFileSync(path, 'utf8')));
  if (!parsed.success) throw new Error(`${path}:\n${z.prettifyError(parsed.error)}`);
  return parsed.data.accepted;
}

export interface GateVerdict {
  passed: boolean;
  /** HIGH or MEDIUM findings no explanation accepts: each fails the gate. */
  unexplained: ScannerFinding[];
  /** Explanations matching no finding: each fails the gate, since it could later excuse new code. */
  stale: Explanation[];
  explained: { finding: ScannerFinding; explanation: Explanation }[];
  /** LOW and INFORMATIONAL findings nobody explained: shown, never failing. */
  belowGate: ScannerFinding[];
}

/**
 * Judges findings against the explanations. One explanation accepts one finding: matched by
 * check id, file and code line (never the line number, so edits elsewhere do not unsettle
 * it; a change to the flagged line itself calls for a fresh look).
 *
 * @param findings - the scan's findings
 * @param explanations - the accepted ones, with their reasons
 * @returns what passes, what fails and why
 */
export function judgeFindings(
  findings: readonly ScannerFinding[],
  explanations: readonly Explanation[],
): GateVerdict {
  const unused = [...explanations];
  const verdict: GateVerdict = {
    passed: false,
    unexplained: [],
    stale: [],
    explained: [],
    belowGate: [],
  };
  for (const finding of findings) {
    const index = unused.findIndex((entry) => keyOf(entry) === keyOf(finding));
    const explanation = index >= 0 ? unused.splice(index, 1)[0] : undefined;
    if (explanation) verdict.explained.push({ finding, explanation });
    else if (GATED_SEVERITIES.includes(finding.severity)) verdict.unexplained.push(finding);
    else verdict.belowGate.push(finding);
  }
  verdict.stale = unused;
  verdict.passed = verdict.unexplained.length === 0 && verdict.stale.length === 0;
  return verdict;
}

/** The verdict as lines of plain text, failures first. */
export function formatVerdict(verdict: GateVerdict): string {
  const where = (f: ScannerFinding) => `${f.file}:${f.line}:${f.column}`;
  const lines = [
    ...verdict.unexplained.map(
      (f) =>
        `FAIL ${f.severity} ${f.checkId} ${where(f)} ${f.description}${f.sample ? `\n       ${normalizedSample(f.sample)}` : ''}`,
    ),
    ...verdict.stale.map(
      (e) =>
        `FAIL stale explanation ${e.checkId} ${e.file} "${e.sample}": it matches no finding; remove it`,
    ),
    ...verdict.explained.map(
      (p) => `ok   ${p.finding.checkId} ${where(p.finding)} (${p.explanation.verdict})`,
    ),
    ...verdict.belowGate.map((f) => `note ${f.severity} ${f.checkId} ${where(f)} ${f.description}`),
  ];
  lines.push(verdict.passed ? 'electronegativity gate: passed' : 'electronegativity gate: FAILED');
  return lines.join('\n');
}

/**
 * Scans a folder and judges the findings.
 *
 * @param options.inputFolder - the folder to scan; electron/ by default
 * @param options.explanationsPath - the explanations file; the project's by default
 * @param options.electronVersion - the version the scanner assumes; the installed one by default
 * @returns the verdict
 */
export async function runGate(
  options: { inputFolder?: string; explanationsPath?: string; electronVersion?: string } = {},
): Promise<GateVerdict> {
  const findings = await scanFolder({
    inputFolder: options.inputFolder ?? join(PROJECT_ROOT, 'electron'),
    electronVersion: options.electronVersion ?? installedElectronVersion(),
  });
  return judgeFindings(findings, loadExplanations(options.explanationsPath));
}

async function main(argv: readonly string[]): Promise<number> {
  const { values, positionals } = parseArgs({
    args: [...argv],
    options: { explanations: { type: 'string' }, 'electron-version': { type: 'string' } },
    allowPositionals: true,
  });
  const verdict = await runGate({
    ...(positionals[0] ? { inputFolder: positionals[0] } : {}),
    ...(values.explanations ? { explanationsPath: values.explanations } : {}),
    ...(values['electron-version'] ? { electronVersion: values['electron-version'] } : {}),
  });
  console.log(formatVerdict(verdict));
  return verdict.passed ? 0 : 1;
}

const runDirectly =
  process.argv[1] !== undefined && import.meta.url === pathToFileURL(resolve(process.argv[1])).href;
if (runDirectly) {
  try {
    process.exitCode = await main(process.argv.slice(2));
  } catch (error) {
    console.error(`electronegativity gate: could not run: ${(error as Error).message}`);
    process.exitCode = 2;
  }
}
