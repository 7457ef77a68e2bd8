/**
 * The working behind each measure's figures (core/plan/trace.ts), checked three ways:
 *
 * 1. every line's result is the report's figure for that measure (core/report.ts reportOf):
 *    to the cent for money, to float rounding for energy;
 * 2. every line's formula, worked here from its own inputs with the published formulas
 *    (written out below, not the engine's functions), gives its result;
 * 3. one chain worked by hand for a small invented house, with the UPV* factor also checked
 *    against @formulajs/formulajs PV.
 *
 * Sources: sensible heat of air 0.018 Btu/(ft³·°F) = 0.075 lb/ft³ × 0.24 Btu/(lb·°F) and the
 * 1.08 Btu/(h·cfm·°F) factor (ASHRAE Handbook of Fundamentals, load calculation chapters);
 * standard atmosphere p/p₀ = (1 − 6.8754e-6·Z)^5.2559, Z in ft (ASHRAE HoF 2017 ch. 1 eq. 3);
 * 62.2 fan need Q_tot − Φ·Q_inf (ANSI/ASHRAE 62.2-2016 §4.1.2); infiltration and an
 * unbalanced fan combined in quadrature (ASHRAE HoF 2009 ch. 16); UPV* =
 * (1 + e)/(d − e)·(1 − ((1 + e)/(1 + d))ⁿ) (NIST Handbook 135); CRF = d/(1 − (1 + d)^−n)
 * (Meier, Wright & Rosenfeld 1983); heat contents 100,000 Btu/therm and 3,412 Btu/kWh (U.S. EIA).
 * The demo homes are only inputs here: every expected value comes from the report or from the
 * formulas, never from the demo's own figures.
 */
import * as formula from '@formulajs/formulajs';
import Decimal from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { evaluateHome, reportOf, type Evaluation } from '../../core/evaluate.ts';
import { explainMeasure, type MeasureTrace, type TraceLine } from '../../core/plan/trace.ts';
import type { MeasureReport } from '../../core/report.ts';
import type { HomeFileInput } from '../../core/schema.ts';
import { DEMO_HOMES } from '../../db/demo/alder-creek.ts';
import { validBaseHome } from '../_lib/base-home.ts';
import { expectInputError } from '../_lib/expect-input-error.ts';
import { homeArbitrary } from '../_lib/home-arbitrary.ts';

/** Relative tolerance for energy worked two ways in float64 (a few ulps over a sum). */
const FLOAT_RELATIVE = 1e-9;
/** Half a cent: a figure worked here in float64 from inputs shown as floats may round the other way. */
const HALF_CENT = 0.005 + 1e-9;

function lineOf(trace: MeasureTrace, key: string): TraceLine {
  const line = trace.lines.find((candidate) => candidate.key === key);
  if (!line) expect.fail(`no line "${key}" in the trace of ${trace.measureId}`);
  return line;
}

function resultOf(trace: MeasureTrace, key: string): number | null {
  return lineOf(trace, key).result.value;
}

/** The value of the input whose label starts with `labelStart` (there must be exactly one). */
function inputOf(line: TraceLine, labelStart: string): number {
  const found = line.inputs.filter((item) => item.label.startsWith(labelStart));
  expect(found, `${line.key}: inputs starting "${labelStart}"`).toHaveLength(1);
  const value = found[0]?.value;
  if (value === null || value === undefined) expect.fail(`${line.key}: "${labelStart}" has none`);
  return value;
}

/** The value of the input whose label ends with the symbol ` ${symbol}` (exactly one). */
function symbolOf(line: TraceLine, symbol: string): number {
  const found = line.inputs.filter((item) => item.label.endsWith(` ${symbol}`));
  expect(found, `${line.key}: inputs ending "${symbol}"`).toHaveLength(1);
  const value = found[0]?.value;
  if (value === null || value === undefined) expect.fail(`${line.key}: "${symbol}" has none`);
  return value;
}

function hasInput(line: TraceLine, labelStart: string): boolean {
  return line.inputs.some((item) => item.label.startsWith(labelStart));
}

function expectClose(actual: number | null, expected: number, what: string): void {
  if (actual === null) expect.fail(`${what}: got none, expected ${expected}`);
  const scale = Math.max(1, Math.abs(expected));
  expect(Math.abs(actual - expected), `${what}: ${actual} vs ${expected}`).toBeLessThanOrEqual(
    FLOAT_RELATIVE * scale,
  );
}

/** Rounds to the cent, half away from zero (the commercial rule the README states for money). */
function toCents(amount: Decimal.Value): number {
  return new Decimal(amount).toDecimalPlaces(2, Decimal.ROUND_HALF_UP).toNumber();
}

/** Check 1: the trace's results are the report's figures for the measure. */
function expectReportFigures(trace: MeasureTrace, measure: MeasureReport): void {
  const what = (key: string) => `${measure.id} ${key}`;
  expect(trace.rank).toBe(measure.rank);
  expect(trace.included).toBe(measure.included);
  expectClose(resultOf(trace, 'estimate'), measure.estimateCfm50.likely, what('estimate'));
  expectClose(resultOf(trace, 'cfm50-removed'), measure.cfm50Reduction, what('cfm50-removed'));
  expectClose(resultOf(trace, 'cfm50-after'), measure.cfm50After, what('cfm50-after'));
  expectClose(
    inputOf(lineOf(trace, 'cfm50-removed'), 'CFM50 before'),
    measure.cfm50Before,
    what('CFM50 before'),
  );
  const saved = measure.annualSavings;
  expectClose(resultOf(trace, 'heating-fuel-saved'), saved.heatingFuelUnits, what('fuel'));
  expect(lineOf(trace, 'heating-fuel-saved').result.unit).toBe(saved.heatingFuelUnit);
  const cooling = trace.lines.find((line) => line.key === 'cooling-kwh-saved');
  if (cooling) expectClose(cooling.result.value, saved.coolingKwh, what('cooling kWh'));
  else expect(saved.coolingKwh).toBe(0);
  expectClose(resultOf(trace, 'site-energy-saved'), saved.mmbtu, what('site MMBtu'));
  expectClose(resultOf(trace, 'co2-saved'), saved.co2Kg, what('CO2'));
  // Money: to the cent, exactly.
  expect(resultOf(trace, 'cost'), what('cost')).toBe(measure.costUsd);
  expect(resultOf(trace, 'annual-savings'), what('annual')).toBe(saved.usd);
  expect(resultOf(trace, 'pv-savings'), what('PV')).toBe(measure.pvSavingsUsd);
  expect(resultOf(trace, 'npv'), what('NPV')).toBe(measure.npvUsd);
  expect(resultOf(trace, 'sir'), what('SIR')).toBe(measure.sir);
  expect(resultOf(trace, 'simple-payback'), what('payback')).toBe(measure.simplePaybackYears);
  expect(resultOf(trace, 'cce'), what('CCE')).toBe(measure.cceUsdPerMMBtu);
}

/** UPV* worked here from the NIST Handbook 135 closed form (n when e = d). */
function upvStar(discountRateReal: number, escalationRateReal: number, years: number): number {
  if (Math.abs(discountRateReal - escalationRateReal) < 1e-12) return years;
  const ratio = (1 + escalationRateReal) / (1 + discountRateReal);
  return (
    ((1 + escalationRateReal) / (discountRateReal - escalationRateReal)) * (1 - ratio ** years)
  );
}

/** Check 2: each line's formula, worked here from its inputs, gives its result. */
function expectLineWorks(line: TraceLine): void {
  const at = (labelStart: string) => inputOf(line, labelStart);
  const result = line.result.value;
  const what = line.key;
  switch (true) {
    case line.key === 'estimate': {
      if (hasInput(line, 'Units of work')) {
        const ela = at('Units of work') * at('Leakage area per unit') * at('Share of that');
        expectClose(result, ela / at('Leakage area at 4 Pa of 1 CFM50'), what);
      } else if (hasInput(line, 'Share of the leakage')) {
        expectClose(result, at('Share of the leakage') * at('Test-in leakage'), what);
      } else {
        expectClose(result, at('Likely reduction entered'), what);
      }
      return;
    }
    case line.key === 'cfm50-removed': {
      const aboveFloor = Math.max(0, at('CFM50 before') - at('Leakage floor'));
      expectClose(result, Math.min(at('Likely estimate'), at('Leakage left'), aboveFloor), what);
      return;
    }
    case line.key === 'cfm50-after':
      expectClose(result, at('CFM50 before') - at('Leakage removed'), what);
      return;
    case line.key.startsWith('fan-flow-'):
      // 62.2 §4.1.2: Q_fan = Q_tot − Φ·Q_inf, never below the fans the house runs.
      expectClose(
        result,
        Math.max(
          at('Fans the house'),
          at('62.2 total') - at('Credit factor') * at('62.2 infiltration'),
        ),
        what,
      );
      return;
    case /^(heating|cooling)-airflow-/.test(line.key): {
      const natural = at('Natural infiltration');
      const fan = at('Ventilation fan flow');
      const expected =
        line.formula === 'Q = Q_nat'
          ? natural
          : line.formula === 'Q = Q_fan + Q_nat'
            ? fan + natural
            : Math.sqrt(fan * fan + natural * natural);
      if (line.formula === 'Q = Q_nat') expect(fan).toBe(0);
      expectClose(result, expected, what);
      return;
    }
    case line.key === 'pressure-ratio':
      expectClose(result, (1 - 6.8754e-6 * at('Site elevation')) ** 5.2559, what);
      return;
    case line.key === 'heating-load-saved' || line.key === 'cooling-sensible-saved': {
      expect(at('Heat capacity of sea-level air')).toBe(0.075 * 0.24);
      const degreeDays = at(
        line.key === 'heating-load-saved' ? 'Heating degree' : 'Cooling degree',
      );
      const deltaCfm = at('Outdoor air before') - at('Outdoor air after');
      const expected = 0.018 * at('Site pressure ratio') * deltaCfm * 60 * 24 * degreeDays;
      expectClose(result, expected, what);
      return;
    }
    case line.key === 'cooling-latent-saved': {
      const deltaCfm = at('Outdoor air before') - at('Outdoor air after');
      const expected = 0.68 * at('Site pressure ratio') * deltaCfm * at('Moisture excess');
      expectClose(result, expected, what);
      return;
    }
    case line.key === 'cooling-load-saved':
      expectClose(result, at('Sensible part') + at('Latent part'), what);
      return;
    case line.key === 'heating-fuel-saved': {
      const load = at('Heating load saved');
      const distribution = at('Distribution efficiency');
      const expected = hasInput(line, 'Heat pump HSPF')
        ? load / (at('Heat pump HSPF') * distribution) / 1000
        : load / (symbolOf(line, 'η') * distribution * at('Heat content'));
      expectClose(result, expected, what);
      return;
    }
    case line.key === 'cooling-kwh-saved':
      expectClose(
        result,
        at('Cooling load saved') / (at('Cooling SEER') * at('Distribution efficiency')) / 1000,
        what,
      );
      return;
    case line.key === 'fan-kwh-saved':
      expect(at('Hours in a year')).toBe(8760);
      expectClose(
        result,
        ((at('Fan flow before') - at('Fan flow after')) * at('Fan power per flow') * 8760) / 1000,
        what,
      );
      return;
    case line.key === 'site-energy-saved': {
      const cooling = hasInput(line, 'Cooling electricity') ? at('Cooling electricity') : 0;
      const electricKwh = cooling + at('Fan electricity');
      const fuelBtu = at('Heating fuel saved') * at('Heat content');
      expectClose(result, (fuelBtu + electricKwh * 3412) / 1e6, what);
      return;
    }
    case line.key === 'co2-saved': {
      const cooling = hasInput(line, 'Cooling electricity') ? at('Cooling electricity') : 0;
      const grid = at('Grid CO₂ factor');
      const expected = hasInput(line, 'Heating electricity')
        ? (at('Heating electricity') + cooling + at('Fan electricity')) * grid
        : ((at('Heating fuel saved') * at('Heat content')) / 1e6) * at('CO₂ of') +
          (cooling + at('Fan electricity')) * grid;
      expectClose(result, expected, what);
      return;
    }
    case line.key === 'cost': {
      const materials = new Decimal(at('Materials'));
      const labour = new Decimal(toCents(new Decimal(at('Labour hours')).times(at('Labour rate'))));
      const markup = new Decimal(toCents(materials.plus(labour).times(at('Markup'))));
      expect(result, what).toBe(materials.plus(labour).plus(markup).toNumber());
      return;
    }
    case line.key === 'annual-savings': {
      let expected = new Decimal(at('Heating fuel saved')).times(symbolOf(line, 'p_fuel'));
      if (line.inputs.some((item) => item.label.endsWith(' p_elec'))) {
        const cooling = hasInput(line, 'Cooling electricity') ? at('Cooling electricity') : 0;
        const electricKwh = new Decimal(cooling).plus(at('Fan electricity'));
        expected = expected.plus(electricKwh.times(symbolOf(line, 'p_elec')));
      }
      expect(Math.abs((result ?? NaN) - toCents(expected)), what).toBeLessThanOrEqual(HALF_CENT);
      return;
    }
    case line.key.startsWith('upv-'): {
      const expected = upvStar(at('Real discount rate'), at('Real escalation'), at('Life of'));
      expectClose(result, expected, what);
      return;
    }
    case line.key === 'pv-savings': {
      // PV = Σ over what is bought of a year's savings × its UPV* factor.
      let expected = symbolOf(line, 'S_fuel') * symbolOf(line, 'UPV*_fuel');
      if (line.inputs.some((item) => item.label.endsWith(' S_elec'))) {
        expected += symbolOf(line, 'S_elec') * symbolOf(line, 'UPV*_elec');
      }
      expect(Math.abs((result ?? NaN) - toCents(expected)), what).toBeLessThanOrEqual(HALF_CENT);
      return;
    }
    case line.key === 'npv':
      expect(result, what).toBe(new Decimal(at('Present value')).minus(at('Cost C')).toNumber());
      return;
    case line.key === 'sir': {
      const cost = at('Cost C');
      if (result === null) {
        expect(line.note, what).toMatch(/health-and-safety|costs nothing/);
        return;
      }
      expect(result, what).toBe(
        new Decimal(at('Present value')).div(cost).toDecimalPlaces(4).toNumber(),
      );
      return;
    }
    case line.key === 'simple-payback': {
      const savings = at('First year’s savings');
      if (savings <= 0) {
        expect(result, what).toBeNull();
        return;
      }
      expect(result, what).toBe(
        new Decimal(at('Cost C')).div(savings).toDecimalPlaces(4).toNumber(),
      );
      return;
    }
    case line.key === 'cce': {
      const energy = at('Site energy saved');
      if (energy <= 0) {
        expect(result, what).toBeNull();
        return;
      }
      expect(
        Math.abs((result ?? NaN) - toCents((at('Cost C') * at('Capital recovery')) / energy)),
        what,
      ).toBeLessThanOrEqual(HALF_CENT);
      return;
    }
    default:
      expect.fail(`no check for line "${line.key}"`);
  }
}

/** Checks 1 and 2 for every measure of an evaluation; returns how many measures were checked. */
function checkEvaluation(evaluation: Evaluation): number {
  const report = reportOf(evaluation);
  for (const measure of report.measures) {
    const trace = explainMeasure(evaluation, measure.id);
    expect(trace.measureId).toBe(measure.id);
    expectReportFigures(trace, measure);
    for (const line of trace.lines) {
      expectLineWorks(line);
      // The pieces of a trace are plain JSON and finite, so a channel can carry them.
      for (const figure of [line.result, ...line.inputs]) {
        if (figure.value !== null) expect(Number.isFinite(figure.value), `${line.key}`).toBe(true);
      }
    }
  }
  return report.measures.length;
}

/** Every line key and formula met, to show the checks reached each kind of line. */
const seen = { keys: new Set<string>(), formulas: new Set<string>() };

function checkAndRecord(evaluation: Evaluation): number {
  const count = checkEvaluation(evaluation);
  for (const measure of evaluation.plan.entries) {
    for (const line of explainMeasure(evaluation, measure.step.measure.id).lines) {
      seen.keys.add(line.key);
      seen.formulas.add(line.formula);
    }
  }
  return count;
}

describe('a trace agrees with the report and with its own formulas', () => {
  it('for every measure of every demo home', () => {
    let measures = 0;
    for (const home of DEMO_HOMES) measures += checkAndRecord(evaluateHome(home));
    expect(measures).toBeGreaterThan(DEMO_HOMES.length);
  });

  it('for every measure of the test base house (cooling, all three estimate kinds)', () => {
    expect(checkAndRecord(evaluateHome(validBaseHome()))).toBe(3);
  });

  it('for every measure of generated homes (every method, fuel, equipment, with and without cooling)', () => {
    fc.assert(
      fc.property(homeArbitrary({ measureCount: { min: 1, max: 6 } }), (home) => {
        checkAndRecord(evaluateHome(home));
      }),
      { seed: 0x7ace, numRuns: 60 },
    );
  });

  it('met every kind of line and every way of combining fan and infiltration', () => {
    for (const key of [
      'estimate',
      'cooling-latent-saved',
      'cooling-kwh-saved',
      'upv-electricity',
      'fan-flow-before',
    ]) {
      expect(seen.keys, key).toContain(key);
    }
    for (const combined of ['Q = Q_nat', 'Q = √(Q_fan² + Q_nat²)', 'Q = Q_fan + Q_nat']) {
      expect(seen.formulas, combined).toContain(combined);
    }
    expect(seen.formulas).toContain('ΔkWh = ΔQ_heat ÷ (HSPF × η_dist) ÷ 1000 Wh/kWh');
    expect(seen.formulas).toContain('E = N × A × ε ÷ ELA₄(1 CFM50, n)');
    expect(seen.formulas).toContain('E = s × L₀(location)');
  });
});

describe('which measures a step was valued after', () => {
  it('names the package measures ranked above it, or the whole package for one left out', () => {
    for (const home of [...DEMO_HOMES, validBaseHome() as unknown as HomeFileInput]) {
      const evaluation = evaluateHome(home);
      const report = reportOf(evaluation);
      const packageIds = report.package.measureIds;
      for (const measure of report.measures) {
        const trace = explainMeasure(evaluation, measure.id);
        expect(trace.appliedAfter).toEqual(
          measure.included ? packageIds.slice(0, packageIds.indexOf(measure.id)) : packageIds,
        );
      }
    }
  });
});

describe('a chain worked by hand', () => {
  // An invented house: N-factor method with N = 20 (so Q_nat = CFM50 ÷ 20), sea level, a
  // gas furnace, an exhaust fan of 40 cfm running already, and one sealing measure.
  const home: HomeFileInput = {
    format: 'sealwork-home/1',
    name: 'Hand-worked test house',
    house: {
      conditionedFloorAreaFt2: 1500,
      conditionedVolumeFt3: 12_000,
      stories: 1,
      heightFt: 10,
      bedrooms: 3,
      shelterClass: 3,
      foundation: 'basement',
      yearBuilt: 1985,
    },
    climate: {
      name: 'Hand climate',
      hdd65F: 6000,
      cdd65F: 0,
      elevationFt: 0,
      wsf: 0.6,
      heatingSeason: { meanDeltaTF: 35, meanWindSpeedMph: 10 },
    },
    heating: {
      fuel: 'naturalGas',
      equipment: 'furnace',
      efficiency: 0.8,
      combustionVenting: 'sealed',
    },
    cooling: null,
    prices: { naturalGas: { usdPerUnit: 1.2, escalationRateReal: 0.02 } },
    economics: { discountRateReal: 0.03 },
    infiltrationMethod: 'nFactor',
    nFactorOverride: 20,
    leakageTest: { cfm50: 3000 },
    leakShares: { ceiling: 0.5, wall: 0.3, floor: 0.2, flue: 0 },
    ventilation: { existingFanCfm: 40, fanType: 'exhaust' },
    measures: [
      {
        id: 'top-plates',
        type: 'attic-top-plates',
        reductionCfm50: { low: 300, likely: 400, high: 500 },
        cost: { materialsUsd: 300, laborHours: 4, laborRateUsdPerHour: 50, markupFraction: 0.1 },
        lifeYears: 20,
      },
    ],
  };
  const trace = explainMeasure(evaluateHome(home), 'top-plates');

  // 62.2: Q_tot = 0.03 × 1500 + 7.5 × (3 + 1) = 75 cfm; Q_inf = 0.052 × CFM50 × 0.6 ×
  // (10/8.2)^0.4 is above 75 cfm at 3000 and at 2600 CFM50, so the fan need is 0 and the fan
  // stays the 40 cfm the house runs. Exhaust fan and infiltration add in quadrature.
  const before = Math.sqrt(40 ** 2 + (3000 / 20) ** 2);
  const after = Math.sqrt(40 ** 2 + (2600 / 20) ** 2);
  // 0.018 Btu/(ft³·°F) × 60 min/h × 24 h/day = 25.92 Btu per cfm·°F·day at sea level.
  const loadBtu = 25.92 * (before - after) * 6000;
  const therms = loadBtu / (0.8 * 100_000);
  const upv = (1.02 / (0.03 - 0.02)) * (1 - (1.02 / 1.03) ** 20);
  const crf = 0.03 / (1 - 1.03 ** -20);

  it('lists the lines of a heating-only house in order', () => {
    expect(trace.lines.map((line) => line.key)).toEqual([
      'estimate',
      'cfm50-removed',
      'cfm50-after',
      'fan-flow-before',
      'fan-flow-after',
      'heating-airflow-before',
      'heating-airflow-after',
      'pressure-ratio',
      'heating-load-saved',
      'heating-fuel-saved',
      'fan-kwh-saved',
      'site-energy-saved',
      'co2-saved',
      'cost',
      'annual-savings',
      'upv-heating',
      'pv-savings',
      'npv',
      'sir',
      'simple-payback',
      'cce',
    ]);
  });

  it('works the leakage and the air flows', () => {
    expect(0.018 * 60 * 24).toBeCloseTo(25.92, 12);
    expect(resultOf(trace, 'cfm50-removed')).toBe(400);
    expectClose(resultOf(trace, 'cfm50-after'), 2600, 'after');
    expect(resultOf(trace, 'fan-flow-before')).toBe(40);
    expect(resultOf(trace, 'fan-flow-after')).toBe(40);
    expectClose(resultOf(trace, 'heating-airflow-before'), before, 'air before');
    expectClose(resultOf(trace, 'heating-airflow-after'), after, 'air after');
    expect(resultOf(trace, 'pressure-ratio')).toBe(1);
  });

  it('works the load, the fuel, the site energy and the CO2', () => {
    expectClose(resultOf(trace, 'heating-load-saved'), loadBtu, 'load');
    expectClose(resultOf(trace, 'heating-fuel-saved'), therms, 'therms');
    expect(resultOf(trace, 'fan-kwh-saved')).toBe(0);
    expectClose(resultOf(trace, 'site-energy-saved'), therms / 10, 'MMBtu');
    // U.S. EIA CO2 coefficient of natural gas, 53.06 kg/MMBtu.
    expectClose(resultOf(trace, 'co2-saved'), (therms / 10) * 53.06, 'CO2');
  });

  it('works the money to the cent, with UPV* as formulajs PV of the escalation-adjusted rate', () => {
    // Σ_{k=1..n} ((1+e)/(1+d))^k is an annuity of 1 at the rate (1+d)/(1+e) − 1.
    const annuityRate = 1.03 / 1.02 - 1;
    expect(upv).toBeCloseTo(Number(formula.PV(annuityRate, 20, -1)), 9);
    expect(crf).toBeCloseTo(Number(formula.PMT(0.03, 20, -1)), 12);
    expectClose(resultOf(trace, 'upv-heating'), upv, 'UPV*');
    const annualUsd = toCents(therms * 1.2);
    const pvUsd = toCents(therms * 1.2 * upv);
    expect(resultOf(trace, 'cost')).toBe(550);
    expect(resultOf(trace, 'annual-savings')).toBe(annualUsd);
    expect(resultOf(trace, 'pv-savings')).toBe(pvUsd);
    expect(resultOf(trace, 'npv')).toBe(new Decimal(pvUsd).minus(550).toNumber());
    expect(resultOf(trace, 'sir')).toBe(new Decimal(pvUsd).div(550).toDecimalPlaces(4).toNumber());
    expect(resultOf(trace, 'simple-payback')).toBe(
      new Decimal(550).div(annualUsd).toDecimalPlaces(4).toNumber(),
    );
    expect(resultOf(trace, 'cce')).toBe(toCents((550 * crf) / (therms / 10)));
  });
});

describe('bad input', () => {
  it('refuses a measure the home does not have, naming measureId and the ids it has', () => {
    const evaluation = evaluateHome(validBaseHome());
    expectInputError(
      () => explainMeasure(evaluation, 'no-such-measure'),
      'measureId',
      /^measureId: expected the id of one of the home's measures \("m1", "m2", "m3"\), got "no-such-measure"$/,
    );
  });
});
