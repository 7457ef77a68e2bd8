/**
 * The command line end to end. The main case runs `node electron/sealwork.js evaluate FILE
 * --json` as a real child process and holds every figure of the report to a hand computation
 * written here from the published formulas (nothing below calls core/ to get an expected
 * value). The other cases run through `main()` with a capturing output.
 *
 * The house is invented for this test: one storey, 1200 ft², a one-point test of 2400 CFM50,
 * the LBL climate factor with N set by the auditor, a gas furnace, no cooling, 1000 ft up,
 * and an existing 20 cfm balanced fan (an ERV) that, with the 62.2 infiltration credit,
 * covers the 62.2 rate after sealing, so no fan is added.
 */
import { execFile } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { EvaluationReport, MeasureReport } from '../../core/report.ts';
import { makeTempFolder, runCli, type TempFolder } from '../_lib/cli-harness.ts';

const REPO_ROOT = fileURLToPath(new URL('../..', import.meta.url));
const runFile = promisify(execFile);

// ── The house ────────────────────────────────────────────────────────────────────────────
const FLOOR_AREA_FT2 = 1200;
const VOLUME_FT3 = 9600;
const HEIGHT_FT = 10;
const BEDROOMS = 2;
const HDD65F = 5400;
const ELEVATION_FT = 1000;
const WSF = 0.62;
const CFM50 = 2400;
const N_FACTOR = 17.5;
const AFUE = 0.8;
const DISTRIBUTION_EFFICIENCY = 0.85;
const GAS_USD_PER_THERM = 1.4;
const GAS_ESCALATION_REAL = 0.01;
const DISCOUNT_RATE_REAL = 0.03;
const EXISTING_BALANCED_FAN_CFM = 20;

interface HandMeasure {
  id: string;
  type: string;
  reductionCfm50: { low: number; likely: number; high: number };
  materialsUsd: number;
  laborHours: number;
  laborRateUsdPerHour: number;
  markupFraction: number;
  lifeYears: number;
}

const MEASURES: readonly HandMeasure[] = [
  {
    id: 'rim-north',
    type: 'rim-joist',
    reductionCfm50: { low: 150, likely: 220, high: 300 },
    materialsUsd: 120.4,
    laborHours: 5.5,
    laborRateUsdPerHour: 60,
    markupFraction: 0,
    lifeYears: 20,
  },
  {
    id: 'windows',
    type: 'window-sealing',
    reductionCfm50: { low: 30, likely: 60, high: 90 },
    materialsUsd: 45,
    laborHours: 3,
    laborRateUsdPerHour: 60,
    markupFraction: 0,
    lifeYears: 10,
  },
  {
    id: 'attic-chase',
    type: 'attic-chases',
    reductionCfm50: { low: 250, likely: 350, high: 450 },
    materialsUsd: 85,
    laborHours: 4,
    laborRateUsdPerHour: 60,
    markupFraction: 0.1,
    lifeYears: 20,
  },
];

const HOME = {
  format: 'sealwork-home/1',
  name: 'CLI hand-check house',
  house: {
    conditionedFloorAreaFt2: FLOOR_AREA_FT2,
    conditionedVolumeFt3: VOLUME_FT3,
    stories: 1,
    heightFt: HEIGHT_FT,
    bedrooms: BEDROOMS,
    shelterClass: 3,
    foundation: 'basement',
    yearBuilt: 1978,
  },
  climate: {
    name: 'Hand-check climate',
    hdd65F: HDD65F,
    cdd65F: 600,
    elevationFt: ELEVATION_FT,
    wsf: WSF,
  },
  heating: {
    fuel: 'naturalGas',
    equipment: 'furnace',
    efficiency: AFUE,
    distributionEfficiency: DISTRIBUTION_EFFICIENCY,
    combustionVenting: 'inducedDraft',
  },
  prices: {
    naturalGas: { usdPerUnit: GAS_USD_PER_THERM, escalationRateReal: GAS_ESCALATION_REAL },
  },
  economics: { discountRateReal: DISCOUNT_RATE_REAL, ranking: 'sir' },
  infiltrationMethod: 'nFactor',
  nFactorOverride: N_FACTOR,
  leakageTest: { cfm50: CFM50 },
  ventilation: { existingFanCfm: EXISTING_BALANCED_FAN_CFM, fanType: 'balanced' },
  measures: MEASURES.map((m) => ({
    id: m.id,
    type: m.type,
    reductionCfm50: m.reductionCfm50,
    cost: {
      materialsUsd: m.materialsUsd,
      laborHours: m.laborHours,
      laborRateUsdPerHour: m.laborRateUsdPerHour,
      ...(m.markupFraction > 0 ? { markupFraction: m.markupFraction } : {}),
    },
    lifeYears: m.lifeYears,
  })),
};

// ── The hand computation ─────────────────────────────────────────────────────────────────
/** Exact by definition of the foot (NIST SP 811): 1 cfm = 0.3048³/60 m³/s; 1 in² = 0.00064516 m². */
const M3_PER_S_PER_CFM = 0.3048 ** 3 / 60;
const M2_PER_IN2 = 0.00064516;
/** Flow exponent of a one-point test, 0.65 (ASTM E1827 / RESNET 380; from memory). */
const ONE_POINT_EXPONENT = 0.65;
/** Air density of the leakage-area definitions, 1.2 kg/m³ (ASHRAE HoF ventilation chapter). */
const RHO_KG_PER_M3 = 1.2;
/** 0.075 lb/ft³ × 0.24 Btu/(lb·°F) (common practice; ASHRAE HoF load calculation chapters). */
const AIR_BTU_PER_FT3_F = 0.018;
/** Natural gas: 100,000 Btu/therm (U.S. EIA, "British thermal units (Btu)"). */
const BTU_PER_THERM = 100_000;
/** Natural gas: 53.06 kg CO2/MMBtu (U.S. EIA, CO2 emission coefficients). */
const GAS_KG_CO2_PER_MMBTU = 53.06;

/** Leakage area at ΔP_r with C_D: A = Q_r·√(ρ/(2·ΔP_r))/C_D, Q_r = C·ΔP_rⁿ (ASHRAE HoF). */
function leakageAreaIn2(cfm50: number, referencePa: number, dischargeCoefficient: number): number {
  const coefficient = cfm50 / 50 ** ONE_POINT_EXPONENT;
  const flowM3PerS = coefficient * referencePa ** ONE_POINT_EXPONENT * M3_PER_S_PER_CFM;
  return (
    (flowM3PerS * Math.sqrt(RHO_KG_PER_M3 / (2 * referencePa))) / dischargeCoefficient / M2_PER_IN2
  );
}

/** Standard atmosphere p/p₀ = (1 − 6.8754e-6·Z)^5.2559, Z in ft (ASHRAE HoF 2017 ch. 1 eq. 3). */
const PRESSURE_RATIO = (1 - 6.8754e-6 * ELEVATION_FT) ** 5.2559;

/** Natural infiltration by the LBL climate factor: CFM50/N (Sherman 1987). */
function naturalCfm(cfm50: number): number {
  return cfm50 / N_FACTOR;
}

/**
 * Heating-season air of the house: natural infiltration plus the balanced fan, which adds
 * its whole flow (ASHRAE HoF 2009 ch. 16: Q = Q_bal + √(Q_unbal² + Q_inf²)).
 */
function heatingAirCfm(cfm50: number): number {
  return EXISTING_BALANCED_FAN_CFM + Math.sqrt(naturalCfm(cfm50) ** 2);
}

/** Seasonal sensible load, 0.018·(p/p₀)·cfm·60·24·HDD Btu (common practice; ASHRAE HoF). */
function seasonLoadBtu(airCfm: number): number {
  return AIR_BTU_PER_FT3_F * PRESSURE_RATIO * airCfm * 60 * 24 * HDD65F;
}

/** Therms bought for a load: load/(AFUE·η_dist)/100,000 (10 CFR 430 appendix N; EIA). */
function thermsFor(loadBtu: number): number {
  return loadBtu / (AFUE * DISTRIBUTION_EFFICIENCY) / BTU_PER_THERM;
}

/** UPV*(d, e, L) = ((1+e)/(d−e))·(1 − ((1+e)/(1+d))^L) (NIST Handbook 135). */
function upvStar(discount: number, escalation: number, years: number): number {
  return (
    ((1 + escalation) / (discount - escalation)) *
    (1 - ((1 + escalation) / (1 + discount)) ** years)
  );
}

/** CRF(d, L) = d/(1 − (1+d)^−L) (Meier, Wright & Rosenfeld 1983). */
function crf(discount: number, years: number): number {
  return discount / (1 - (1 + discount) ** -years);
}

/** Half away from zero to the cent, as money is reported (README). */
function toCents(usd: number): number {
  return Math.round(usd * 100 + Math.sign(usd) * 1e-9) / 100;
}

interface HandFigures {
  costUsd: number;
  materialsUsd: number;
  laborUsd: number;
  markupUsd: number;
  therms: number;
  usd: number;
  pvUsd: number;
  sir: number;
}

/** Every figure of one measure removing `cfm50Removed` from `cfm50Before`. */
function handMeasure(measure: HandMeasure, cfm50Before: number, cfm50Removed: number): HandFigures {
  const materialsUsd = toCents(measure.materialsUsd);
  const laborUsd = toCents(measure.laborHours * measure.laborRateUsdPerHour);
  const markupUsd = toCents((materialsUsd + laborUsd) * measure.markupFraction);
  const costUsd = toCents(materialsUsd + laborUsd + markupUsd);
  const loadSavedBtu =
    seasonLoadBtu(heatingAirCfm(cfm50Before)) -
    seasonLoadBtu(heatingAirCfm(cfm50Before - cfm50Removed));
  const therms = thermsFor(loadSavedBtu);
  const usdUnrounded = therms * GAS_USD_PER_THERM;
  // NIST Handbook 135: PV of a base-year amount escalating at e = A·UPV*(d, e, L).
  const pvUsd = usdUnrounded * upvStar(DISCOUNT_RATE_REAL, GAS_ESCALATION_REAL, measure.lifeYears);
  return {
    costUsd,
    materialsUsd,
    laborUsd,
    markupUsd,
    therms,
    usd: toCents(usdUnrounded),
    pvUsd,
    sir: pvUsd / costUsd,
  };
}

// ── Tolerances ───────────────────────────────────────────────────────────────────────────
const MONEY_USD = 0.01;
const RATIO = 1e-4;
const PHYSICS_RELATIVE = 1e-9;

function expectMoney(actual: number, expected: number, label: string): void {
  expect(Math.abs(actual - expected), `${label}: ${actual} vs ${expected}`).toBeLessThanOrEqual(
    MONEY_USD + 1e-9,
  );
}

function expectRatio(actual: number | null, expected: number, label: string): void {
  expect(actual, label).not.toBeNull();
  expect(
    Math.abs((actual ?? NaN) - expected),
    `${label}: ${actual} vs ${expected}`,
  ).toBeLessThanOrEqual(RATIO);
}

function expectPhysics(actual: number, expected: number, label: string): void {
  expect(Math.abs(actual - expected), `${label}: ${actual} vs ${expected}`).toBeLessThanOrEqual(
    PHYSICS_RELATIVE * Math.max(1, Math.abs(expected)),
  );
}

function measureById(report: EvaluationReport, id: string): MeasureReport {
  const found = report.measures.find((measure) => measure.id === id);
  if (!found) throw new Error(`no measure ${id} in the report`);
  return found;
}

describe('the hand computation agrees with the published check values', () => {
  // REFERENCES.md check values, derived from the same formulas: a guard on our own arithmetic.
  it('ELA of 2000 CFM50 at n 0.65 is 109.7 in² (ASHRAE HoF ELA definition)', () => {
    expect(leakageAreaIn2(2000, 4, 1)).toBeCloseTo(109.7, 1);
  });
  it('UPV*(3 %, 1 %, 20) = 16.382723 (NIST Handbook 135)', () => {
    expect(upvStar(0.03, 0.01, 20)).toBeCloseTo(16.382723, 6);
  });
  it('CRF(3 %, 15) = 0.083767 (Meier, Wright & Rosenfeld 1983)', () => {
    expect(crf(0.03, 15)).toBeCloseTo(0.083767, 6);
  });
});

describe('sealwork evaluate FILE --json, as a child process, against the hand computation', () => {
  let folder: TempFolder;
  let report: EvaluationReport;
  let stderr: string;

  beforeAll(async () => {
    folder = makeTempFolder('sealwork-cli-');
    const file = folder.write('hand-check.json', HOME);
    const result = await runFile(
      process.execPath,
      ['electron/sealwork.js', 'evaluate', file, '--json'],
      {
        cwd: REPO_ROOT,
        timeout: 60_000,
      },
    );
    stderr = result.stderr;
    report = JSON.parse(result.stdout) as EvaluationReport;
  }, 60_000);
  afterAll(() => folder.remove());

  it('exits 0 (execFile rejects otherwise) with nothing on stderr', () => {
    expect(stderr).toBe('');
    expect(report.format).toBe('sealwork-evaluation/1');
    expect(report.name).toBe(HOME.name);
  });

  it('leakage: CFM50, ACH50, ELA, EqLA and the exponent', () => {
    expectPhysics(report.leakage.cfm50, CFM50, 'cfm50');
    // ACH50 = CFM50·60/V (RESNET 380; ASTM E779).
    expectPhysics(report.leakage.ach50, (CFM50 * 60) / VOLUME_FT3, 'ach50');
    expectPhysics(report.leakage.elaIn2, leakageAreaIn2(CFM50, 4, 1), 'elaIn2');
    // EqLA: 10 Pa, C_D 0.611 (CGSB-149.10; from memory).
    expectPhysics(report.leakage.eqlaIn2, leakageAreaIn2(CFM50, 10, 0.611), 'eqlaIn2');
    expect(report.leakage.exponentN).toBe(ONE_POINT_EXPONENT);
    expectPhysics(report.leakage.coefficientCfmPerPaN, CFM50 / 50 ** ONE_POINT_EXPONENT, 'C');
    expect(report.leakage.pointCount).toBe(1);
  });

  it('natural infiltration: CFMnat = CFM50/N and ACHnat = ACH50/N (Sherman 1987)', () => {
    expect(report.infiltration.method).toBe('nFactor');
    expectPhysics(report.infiltration.cfmNatural, CFM50 / N_FACTOR, 'cfmNatural');
    expectPhysics(
      report.infiltration.achNatural,
      (CFM50 * 60) / VOLUME_FT3 / N_FACTOR,
      'achNatural',
    );
    expect(report.infiltration.coolingSeasonCfm).toBe(0);
  });

  // The plan by hand. Savings are linear in ΔCFM50 here (nFactor, a balanced fan whose flow
  // adds, no floor, no location cap reached), so each measure is worth the same wherever the
  // sequence puts it, and the order is by SIR (10 CFR 440.21: ranked by SIR, each ≥ 1).
  const valued = MEASURES.map((measure) => ({
    measure,
    figures: handMeasure(measure, CFM50, measure.reductionCfm50.likely),
  }));
  const byRank = [...valued].sort((a, b) => b.figures.sir - a.figures.sir);
  const included = byRank.filter((entry) => entry.figures.sir >= 1);
  const excluded = byRank.filter((entry) => entry.figures.sir < 1);

  it('the hand plan takes two measures and leaves one out (so both branches are checked)', () => {
    expect(included.map((entry) => entry.measure.id)).toEqual(['attic-chase', 'rim-north']);
    expect(excluded.map((entry) => entry.measure.id)).toEqual(['windows']);
  });

  it('each measure: rank, reduction, energy, CO2, cost, PV, NPV, SIR, AIRR, payback, CCE', () => {
    let cfm50Before = CFM50;
    [...included, ...excluded].forEach(({ measure, figures }, index) => {
      const line = measureById(report, measure.id);
      const label = (field: string) => `${measure.id}.${field}`;
      expect(line.rank, label('rank')).toBe(index + 1);
      expect(line.included, label('included')).toBe(index < included.length);
      expect(line.sirBelowOne, label('sirBelowOne')).toBe(figures.sir < 1);
      expect(line.estimateMethod).toBe('direct');
      expectPhysics(line.cfm50Reduction, measure.reductionCfm50.likely, label('cfm50Reduction'));
      expectPhysics(line.cfm50Before, cfm50Before, label('cfm50Before'));
      if (line.included) cfm50Before -= measure.reductionCfm50.likely;

      const saved = line.annualSavings;
      expect(saved.heatingFuelUnit).toBe('therm');
      expectPhysics(saved.heatingFuelUnits, figures.therms, label('therms'));
      // 1 therm = 0.1 MMBtu (EIA); CO2 at 53.06 kg/MMBtu (EIA).
      expectPhysics(saved.mmbtu, figures.therms * 0.1, label('mmbtu'));
      expectPhysics(saved.co2Kg, figures.therms * 0.1 * GAS_KG_CO2_PER_MMBTU, label('co2Kg'));
      expect(saved.coolingKwh).toBe(0);
      expectMoney(saved.usd, figures.usd, label('usd'));

      expectMoney(line.cost.materialsUsd, figures.materialsUsd, label('materials'));
      expectMoney(line.cost.laborUsd, figures.laborUsd, label('labor'));
      expectMoney(line.cost.markupUsd, figures.markupUsd, label('markup'));
      expectMoney(line.costUsd, figures.costUsd, label('costUsd'));
      expect(line.lifeYears).toBe(measure.lifeYears);

      expectMoney(line.pvSavingsUsd, figures.pvUsd, label('pv'));
      // NPV = PV(savings) − investment; SIR = PV/investment (10 CFR 436.20, 436.21).
      expectMoney(line.npvUsd, figures.pvUsd - figures.costUsd, label('npv'));
      expectRatio(line.sir, figures.sir, label('sir'));
      // AIRR = (1+d)·SIR^(1/L) − 1 (10 CFR 436.22).
      expectRatio(
        line.airr,
        (1 + DISCOUNT_RATE_REAL) * figures.sir ** (1 / measure.lifeYears) - 1,
        label('airr'),
      );
      // Simple payback = investment / first-year savings, as reported to the cent (436.23).
      expectRatio(line.simplePaybackYears, figures.costUsd / figures.usd, label('payback'));
      // CCE = investment·CRF(d, L)/MMBtu saved a year (Meier, Wright & Rosenfeld 1983).
      expectMoney(
        line.cceUsdPerMMBtu ?? NaN,
        (figures.costUsd * crf(DISCOUNT_RATE_REAL, measure.lifeYears)) / (figures.therms * 0.1),
        label('cce'),
      );

      // The year's savings at the low and high estimates, linear like the likely one.
      const low = handMeasure(measure, CFM50, measure.reductionCfm50.low);
      const high = handMeasure(measure, CFM50, measure.reductionCfm50.high);
      expectMoney(line.annualSavingsUsdRange.low, low.usd, label('usd low'));
      expectMoney(line.annualSavingsUsdRange.high, high.usd, label('usd high'));
    });
  });

  it('the package: ids, leakage after, energy, money, SIR and payback', () => {
    const pkg = report.package;
    const removed = included.reduce((sum, e) => sum + e.measure.reductionCfm50.likely, 0);
    const sum = (pick: (f: HandFigures) => number) =>
      included.reduce((total, entry) => total + pick(entry.figures), 0);
    expect(pkg.measureIds).toEqual(included.map((entry) => entry.measure.id));
    expectPhysics(pkg.cfm50Before, CFM50, 'cfm50Before');
    expectPhysics(pkg.cfm50After, CFM50 - removed, 'cfm50After');
    expectPhysics(pkg.reductionCfm50, removed, 'reductionCfm50');
    expectPhysics(pkg.ach50After, ((CFM50 - removed) * 60) / VOLUME_FT3, 'ach50After');
    expectPhysics(
      pkg.annualSavings.heatingFuelUnits,
      sum((f) => f.therms),
      'therms',
    );
    expectPhysics(pkg.annualSavings.mmbtu, sum((f) => f.therms) * 0.1, 'mmbtu');
    expectPhysics(
      pkg.annualSavings.co2Kg,
      sum((f) => f.therms) * 0.1 * GAS_KG_CO2_PER_MMBTU,
      'co2Kg',
    );
    expect(pkg.annualSavings.ventilationFanKwh).toBe(0);

    const costUsd = sum((f) => f.costUsd);
    const annualUsd = sum((f) => f.usd);
    const pvUsd = sum((f) => f.pvUsd);
    expectMoney(pkg.costUsd, costUsd, 'costUsd');
    expectMoney(pkg.healthAndSafetyCostUsd, 0, 'healthAndSafetyCostUsd');
    expectMoney(pkg.annualSavingsUsd, annualUsd, 'annualSavingsUsd');
    expectMoney(pkg.pvSavingsUsd, pvUsd, 'pvSavingsUsd');
    expectMoney(pkg.npvUsd, pvUsd - costUsd, 'npvUsd');
    expectRatio(pkg.sir, pvUsd / costUsd, 'sir');
    expectRatio(pkg.simplePaybackYears, costUsd / annualUsd, 'simplePaybackYears');
    const low = included.reduce(
      (total, e) => total + handMeasure(e.measure, CFM50, e.measure.reductionCfm50.low).usd,
      0,
    );
    expectMoney(pkg.annualSavingsUsdRange.low, low, 'usd low');
    expect(pkg.financing).toBeNull();
  });

  it('62.2 ventilation: the need, the credit, and no fan added', () => {
    const vent = report.package.ventilation;
    const removed = included.reduce((sum, e) => sum + e.measure.reductionCfm50.likely, 0);
    // Q_tot = 0.03·A + 7.5·(N_br + 1) (ANSI/ASHRAE 62.2 §4.1).
    const requiredCfm = 0.03 * FLOOR_AREA_FT2 + 7.5 * (BEDROOMS + 1);
    // Q_inf = 0.052·Q50·wsf·(H/8.2)^0.4 (62.2 §4.1.2).
    const credit = (cfm50: number) => 0.052 * cfm50 * WSF * (HEIGHT_FT / 8.2) ** 0.4;
    // Balanced fan: Φ = 1, Q_fan = max(0, Q_tot − Q_inf) (62.2 §4.1.2).
    expectPhysics(vent.requiredCfm, requiredCfm, 'requiredCfm');
    expectPhysics(vent.infiltrationCfmBefore, credit(CFM50), 'infiltrationCfmBefore');
    expectPhysics(vent.infiltrationCfm, credit(CFM50 - removed), 'infiltrationCfm');
    expectPhysics(vent.fanCfmBefore, Math.max(0, requiredCfm - credit(CFM50)), 'fanCfmBefore');
    expectPhysics(vent.fanCfm, Math.max(0, requiredCfm - credit(CFM50 - removed)), 'fanCfm');
    expect(vent.fanCfm).toBeLessThanOrEqual(EXISTING_BALANCED_FAN_CFM);
    expect(vent.existingFanCfm).toBe(EXISTING_BALANCED_FAN_CFM);
    expect(vent.infiltrationCreditTaken).toBe(true);
    expect(vent.fanAdded).toBe(false);
    expect(vent.addedFanCfm).toBe(0);
    expect(vent.fanCostUsd).toBe(0);
    expect(vent.fanAnnualCostUsd).toBe(0);
  });
});

describe('sealwork through main()', () => {
  let folder: TempFolder;
  let homeFile: string;
  beforeAll(() => {
    folder = makeTempFolder('sealwork-cli-main-');
    homeFile = folder.write('hand-check.json', HOME);
  });
  afterAll(() => folder.remove());

  const packageCostText = (() => {
    const costUsd = MEASURES.map((m) => handMeasure(m, CFM50, m.reductionCfm50.likely))
      .filter((f) => f.sir >= 1)
      .reduce((total, f) => total + f.costUsd, 0);
    return new Intl.NumberFormat('en-US', { style: 'currency', currency: 'USD' }).format(costUsd);
  })();

  it('the text plan names every measure and the package cost', async () => {
    const run = await runCli(['evaluate', homeFile]);
    expect(run.exitCode).toBe(0);
    expect(run.stderr).toBe('');
    for (const measure of MEASURES) expect(run.stdout).toContain(measure.id);
    expect(packageCostText).toBe('$807.90');
    expect(run.stdout).toContain(packageCostText);
    expect(() => JSON.parse(run.stdout) as unknown).toThrow();
  });

  it('--json prints one JSON report', async () => {
    const run = await runCli(['evaluate', homeFile, '--json']);
    expect(run.exitCode).toBe(0);
    const parsed = JSON.parse(run.stdout) as EvaluationReport;
    expect(parsed.measures.map((m) => m.id).sort()).toEqual(MEASURES.map((m) => m.id).sort());
  });

  it('demo exits 0 and says the scenario is invented', async () => {
    const run = await runCli(['demo']);
    expect(run.exitCode).toBe(0);
    expect(run.stdout).toMatch(/invented demo scenario/);
    expect(run.stdout).toMatch(/made up/);
    expect(run.stderr).toBe('');
  });

  it('demo --json prints a list of reports', async () => {
    const run = await runCli(['demo', '--json']);
    expect(run.exitCode).toBe(0);
    const parsed = JSON.parse(run.stdout) as unknown[];
    expect(Array.isArray(parsed)).toBe(true);
    expect(parsed.length).toBeGreaterThan(0);
  });

  it('help exits 0 and shows the usage', async () => {
    for (const argv of [['help'], ['--help'], []]) {
      const run = await runCli(argv);
      expect(run.exitCode, argv.join(' ')).toBe(0);
      expect(run.stdout).toMatch(/Usage:/);
      expect(run.stdout).toMatch(/evaluate FILE/);
    }
  });

  it('an unknown command exits 2 with nothing on stdout', async () => {
    const run = await runCli(['evalute', homeFile]);
    expect(run.exitCode).toBe(2);
    expect(run.stdout).toBe('');
    expect(run.stderr).toMatch(/unknown command "evalute"/);
  });

  it('evaluate without a file, or with an unknown option, exits 2', async () => {
    for (const argv of [['evaluate'], ['evaluate', homeFile, '--xml']]) {
      const run = await runCli(argv);
      expect(run.exitCode, argv.join(' ')).toBe(2);
      expect(run.stdout).toBe('');
      expect(run.stderr).not.toBe('');
    }
  });

  it('a missing file exits 2 and names it', async () => {
    const missing = `${folder.path}/no-such-home.json`;
    const run = await runCli(['evaluate', missing, '--json']);
    expect(run.exitCode).toBe(2);
    expect(run.stdout).toBe('');
    expect(run.stderr).toContain(missing);
    expect(run.stderr).toMatch(/no such file/);
  });

  it('invalid JSON exits 2 and says so', async () => {
    const broken = folder.write('broken.json', '{ "format": "sealwork-home/1", ');
    const run = await runCli(['evaluate', broken]);
    expect(run.exitCode).toBe(2);
    expect(run.stdout).toBe('');
    expect(run.stderr).toContain(broken);
    expect(run.stderr).toMatch(/not valid JSON/);
  });

  it('a bad home file exits 2 and lists every problem by path', async () => {
    const bad = structuredClone(HOME) as unknown as {
      house: Record<string, unknown>;
      economics: Record<string, unknown>;
      measures: { cost: Record<string, unknown> }[];
    };
    bad.house.bedrooms = 200;
    bad.economics.discountRateReal = 0.5;
    const lastMeasure = bad.measures[2];
    if (!lastMeasure) throw new Error('expected three measures');
    lastMeasure.cost.laborHours = -3;
    const file = folder.write('bad.json', bad);
    const run = await runCli(['evaluate', file, '--json']);
    expect(run.exitCode).toBe(2);
    expect(run.stdout).toBe('');
    for (const path of [
      'house.bedrooms',
      'economics.discountRateReal',
      'measures[2].cost.laborHours',
    ]) {
      expect(run.stderr).toContain(`${path}: `);
    }
  });

  it('the real process exits 2 for a bad home file', async () => {
    const file = folder.write('bad-process.json', { ...HOME, format: 'sealwork-home/9' });
    const failure = await runFile(process.execPath, ['electron/sealwork.js', 'evaluate', file], {
      cwd: REPO_ROOT,
      timeout: 60_000,
    }).then(
      () => null,
      (error: unknown) => error as { code?: number; stdout?: string; stderr?: string },
    );
    expect(failure?.code).toBe(2);
    expect(failure?.stdout).toBe('');
    expect(failure?.stderr).toContain('format: ');
  }, 60_000);
});
