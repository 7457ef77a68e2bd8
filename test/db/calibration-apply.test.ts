/**
 * Applying the program's realization factors (db/calibration-apply.ts) in a real SQLite file.
 * Synthetic tested homes are made here with a known realization (test-out = test-in − 0.7 ×
 * the plan's estimate of the work done), so the fitted factor must come out at 0.7; a home not
 * started then plans with its estimates scaled by exactly that factor, and removing the
 * calibration gives back its plan exactly as before.
 */
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { applyCalibration, removeCalibration } from '../../db/calibration-apply.ts';
import { importHomeFile } from '../../db/home-file.ts';
import { openStore, type Store } from '../../db/store.ts';
import { callChannel } from '../../electron/channels.ts';
import { validBaseHome, type JsonObject } from '../_lib/base-home.ts';
import { makeTempFolder, type TempFolder } from '../_lib/cli-harness.ts';

const TRUE_FACTOR = 0.7;
const TESTED_HOMES = 8;

let folder: TempFolder;
let store: Store;
let openHomeId: number;

function plan(homeId: number) {
  const reply = callChannel({ store }, 'plan.evaluate', { homeId });
  if (!reply.ok) throw new Error(reply.error.message);
  return reply.value;
}

/** A home with one measure of one type, its size varied so the fit has spread to work on. */
function homeWith(cfm50: number, units: number): JsonObject {
  const home = validBaseHome();
  home.leakageTest = { cfm50 };
  home.measures = [
    {
      id: 'rim',
      type: 'rim-joist',
      reductionCfm50: { low: 40 * units, likely: 60 * units, high: 80 * units },
      cost: { materialsUsd: 40, laborHours: 2, laborRateUsdPerHour: 50 },
    },
  ];
  return home;
}

beforeAll(() => {
  folder = makeTempFolder('sealwork-calibration-apply-');
  store = openStore(join(folder.path, 'project.db'));
  for (let index = 0; index < TESTED_HOMES; index += 1) {
    const homeId = store.write((write) =>
      importHomeFile(write, homeWith(3000 + 150 * index, 2 + index)),
    );
    const estimated = plan(homeId).package.reductionCfm50;
    const reply = callChannel({ store }, 'tests.add', {
      homeId,
      test: { kind: 'testOut', cfm50: 3000 + 150 * index - TRUE_FACTOR * estimated },
    });
    if (!reply.ok) throw new Error(reply.error.message);
  }
  openHomeId = store.write((write) => importHomeFile(write, homeWith(3300, 4)));
});

afterAll(() => {
  store.close();
  folder.remove();
});

describe('applying the realization factors', () => {
  it('scales a not-started home’s estimates by the fitted factor, and removing it restores them', () => {
    const before = plan(openHomeId);
    const basis = { label: 'Test-outs to November', date: '2026-11-30' };
    const outcome = store.write((write) =>
      applyCalibration(write, { homeIds: [openHomeId] }, basis),
    );
    expect(outcome.homeIds).toEqual([openHomeId]);
    expect(outcome.factors).toHaveLength(1);
    expect(outcome.factors[0]?.type).toBe('rim-joist');
    expect(outcome.factors[0]?.factor).toBeCloseTo(TRUE_FACTOR, 6);
    expect(outcome.factors[0]?.homes).toBe(TESTED_HOMES);

    const after = plan(openHomeId);
    const [measureBefore] = before.measures;
    const [measureAfter] = after.measures;
    const factor = outcome.factors[0]?.factor ?? NaN;
    expect(measureAfter?.calibrationFactor).toBe(factor);
    expect(measureAfter?.estimateCfm50.likely).toBeCloseTo(
      (measureBefore?.estimateCfm50.likely ?? 0) * factor,
      9,
    );
    expect(after.notes.join(' ')).toContain('Test-outs to November');

    store.write((write) => removeCalibration(write, { homeIds: [openHomeId] }));
    expect(plan(openHomeId)).toEqual(before);
  });

  it('answers through the channel, and refuses a date not written YYYY-MM-DD naming basis.date', () => {
    const few = callChannel({ store }, 'portfolio.applyCalibration', {
      homeIds: [openHomeId],
      basis: { label: 'x', date: '2026-11-30' },
    });
    expect(few.ok).toBe(true);
    const bad = callChannel({ store }, 'portfolio.applyCalibration', {
      homeIds: [openHomeId],
      basis: { label: 'x', date: '30/11/2026' },
    });
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.error.field).toBe('basis.date');
  });
});
