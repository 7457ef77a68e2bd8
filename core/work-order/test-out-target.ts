/**
 * The test-out target of a work order, in plain words: the CFM50 the package aims for, and
 * the stop level, the CFM50 below which ASHRAE 62.2 asks for more ventilation than the fans
 * of the house give, so the crew must stop sealing or add ventilation.
 */
import { formatNumber } from '../format.ts';
import type { HomeModel } from '../home-model.ts';
import type { VentilationOutcome } from '../plan/ventilation-fan.ts';
import { DEFERRAL } from '../safety.ts';

/** How close the solved stop level is to the exact one, CFM50. */
export const STOP_LEVEL_TOLERANCE_CFM50 = 0.01;

/** Above any house this program will meet, CFM50: the search for a bracket stops here. */
const BRACKET_LIMIT_CFM50 = 1e7;

/** Why a stop level applies or not. */
export type StopLevelKind =
  /** The package leaves the house above the level: stop there. */
  | 'stopAt'
  /** The package carries a ventilation fan: no level to stop at, install the fan. */
  | 'fanPlanned'
  /** The fans the house runs meet the whole 62.2 rate at any leakage. */
  | 'fansSuffice';

export interface TestOutTarget {
  testInCfm50: number;
  /** The CFM50 the package aims for: the plan's CFM50 after. */
  targetCfm50: number;
  kind: StopLevelKind;
  /**
   * The CFM50 at which the 62.2 fan need equals the fans the house runs (solved to
   * {@link STOP_LEVEL_TOLERANCE_CFM50}, from above); null without an infiltration credit or
   * when the fans suffice at any leakage.
   */
  thresholdCfm50: number | null;
  /** Whether the 62.2 infiltration credit was taken (a weather and shielding factor is known). */
  infiltrationCreditTaken: boolean;
  requiredCfm: number;
  existingFanCfm: number;
  /** The fan the package adds beyond the existing fans, cfm; 0 when none. */
  addedFanCfm: number;
  /** The target and the stop level in plain words, one sentence each. */
  sentences: string[];
  /** Always given: ventilation and combustion safety follow codes and licensed practice. */
  caution: string;
}

/**
 * The CFM50 below which a house needs more 62.2 fan flow than it runs.
 *
 * @param model - the home's model (its `ventilation` is the engine's 62.2 check)
 * @returns the threshold, CFM50, within {@link STOP_LEVEL_TOLERANCE_CFM50} above the exact
 *   one; null when no credit is taken or the existing fans meet the whole rate
 *
 * Notes: the fan need Q_fan(c) = Q_tot − Φ·Q_inf(c), Q_inf = 0.052·c·wsf·(H/8.2)^0.4, falls as
 * c grows (ANSI/ASHRAE 62.2-2016 §4.1.2). The threshold solves Q_fan(c) = E, E the existing
 * fan flow; with E = 0 it is where the infiltration credit equals the required ventilation.
 * Solved by bisection on the model's own check, keeping lo where the need exceeds E and hi
 * where it does not, until hi − lo ≤ tolerance; hi is returned, so a house tested at the
 * returned level is still covered by its fans. A bisection rather than the closed form so the
 * level is always the one the plan's fan decision uses, whatever that check comes to include.
 */
export function ventilationThresholdCfm50(model: HomeModel): number | null {
  const existing = model.existingFanCfm;
  const atTestIn = model.ventilation(model.testInCfm50);
  if (!atTestIn.infiltrationCreditTaken || atTestIn.requiredCfm <= existing) return null;
  const covered = (cfm50: number) => model.ventilation(cfm50).fanNeedCfm <= existing;
  let lo = 0;
  let hi = Math.max(model.testInCfm50, 1);
  while (!covered(hi)) {
    lo = hi;
    hi *= 2;
    if (hi > BRACKET_LIMIT_CFM50) return null;
  }
  while (hi - lo > STOP_LEVEL_TOLERANCE_CFM50) {
    const middle = (lo + hi) / 2;
    if (covered(middle)) hi = middle;
    else lo = middle;
  }
  return hi;
}

function cfm50Words(value: number): string {
  return `${formatNumber(value)} CFM50`;
}

function cfmWords(value: number): string {
  return `${formatNumber(value)} cfm`;
}

/**
 * The test-out target of a package.
 *
 * @param options.model - the home's model
 * @param options.cfm50After - the package's CFM50 after, the target
 * @param options.ventilation - the package's 62.2 outcome (fan added or not)
 * @param options.volumeFt3 - conditioned volume, ft³ (for ACH50 = CFM50·60/V)
 * @returns the target, the stop level and the sentences that state them
 */
export function testOutTarget(options: {
  model: HomeModel;
  cfm50After: number;
  ventilation: VentilationOutcome;
  volumeFt3: number;
}): TestOutTarget {
  const { model, cfm50After, ventilation, volumeFt3 } = options;
  const threshold = ventilationThresholdCfm50(model);
  const addedFanCfm = ventilation.addedFan?.cfm ?? 0;
  const required = ventilation.requiredCfm;
  const existing = ventilation.existingFanCfm;
  let kind: StopLevelKind = 'stopAt';
  if (ventilation.addedFan !== null) kind = 'fanPlanned';
  else if (threshold === null) kind = 'fansSuffice';

  const ach50 = (cfm50After * 60) / volumeFt3;
  const sentences = [
    `Aim for about ${cfm50Words(cfm50After)} at test-out (${formatNumber(ach50, 1)} ACH50), down from ${cfm50Words(model.testInCfm50)} at test-in.`,
  ];
  // Rounded up: the whole number a crew reads is never below the level.
  const level = threshold === null ? null : Math.ceil(threshold);
  if (kind === 'stopAt' && level !== null) {
    sentences.push(
      `Stop level: ${cfm50Words(level)}. Below it ASHRAE 62.2 asks for more ventilation (${cfmWords(required)} in all) than infiltration and the house's fans (${cfmWords(existing)}) give. If a reading during the work comes near it, stop sealing and ask the auditor: going lower needs a ventilation fan.`,
    );
  } else if (kind === 'fanPlanned') {
    const because =
      level === null
        ? `no infiltration credit is taken (no weather and shielding factor is known), so ASHRAE 62.2 asks for ${cfmWords(required)} of fan flow at any leakage`
        : `below ${cfm50Words(level)} ASHRAE 62.2 asks for more ventilation than infiltration and the house's fans (${cfmWords(existing)}) give`;
    sentences.push(
      `No stop level: the package includes a ventilation fan of ${cfmWords(addedFanCfm)} beyond the existing fans, because ${because}. Install it, measure its flow, and set it to run as 62.2 requires.`,
    );
  } else {
    sentences.push(
      `No stop level: the fans the house runs (${cfmWords(existing)}) meet the whole ASHRAE 62.2 rate of ${cfmWords(required)} at any leakage. Check that they run as 62.2 requires.`,
    );
  }
  return {
    testInCfm50: model.testInCfm50,
    targetCfm50: cfm50After,
    kind,
    thresholdCfm50: threshold,
    infiltrationCreditTaken: ventilation.infiltrationCreditTaken,
    requiredCfm: required,
    existingFanCfm: existing,
    addedFanCfm,
    sentences,
    caution: `Ventilation and combustion safety follow local codes and licensed practice: test every fuel-burning appliance for spillage, draft and CO after the sealing, and check the ventilation before the crew leaves. ${DEFERRAL}`,
  };
}
