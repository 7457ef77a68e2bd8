/** The README's example home file stays a valid home file that evaluates. */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { checkHomeFile } from '../../core/schema.ts';
import { evaluateHomeReport } from '../../core/evaluate.ts';

const readme = readFileSync(new URL('../../README.md', import.meta.url), 'utf8');

describe('README', () => {
  const block = /```json\n([\s\S]*?)```/.exec(readme)?.[1];

  it('shows a home file that parses without a problem', () => {
    expect(block).toBeDefined();
    const result = checkHomeFile(JSON.parse(block ?? 'null'));
    expect(result.ok ? [] : result.problems).toEqual([]);
  });

  it('shows a home file that evaluates to a plan', () => {
    const report = evaluateHomeReport(JSON.parse(block ?? 'null'));
    expect(report.measures.map((measure) => measure.id)).toEqual(['m1']);
  });

  it('states the two set-up commands: the demo and the tests', () => {
    expect(readme).toMatch(/npx sealwork demo/);
    expect(readme).toMatch(/^npm test\b/m);
  });
});
