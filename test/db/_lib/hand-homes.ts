/**
 * Home files built by hand for the store's tests, each stressing one thing a stored home must
 * keep: several readings of one test in the order taken, test-outs after the work, measures
 * done or declined, a client and an address. All are invented houses on the valid base home
 * of test/_lib/base-home.ts.
 */
import { setAt, validBaseHome, type JsonObject } from '../../_lib/base-home.ts';

/**
 * Readings of a multipoint test, deliberately not sorted by pressure, so a store that sorted
 * them (or lost their order) would be seen. They lie near Q = C·ΔPⁿ with n ≈ 0.65, the
 * typical exponent of a house (ASTM E779 fit; "common practice" for the value).
 */
export const MULTIPOINT_READINGS: readonly { pa: number; cfm: number }[] = [
  { pa: 50, cfm: 3200 },
  { pa: 30, cfm: 2310 },
  { pa: 45, cfm: 2990 },
  { pa: 20, cfm: 1780 },
  { pa: 12, cfm: 1260 },
];

/**
 * A home whose test-in is several (pressure, flow) readings.
 *
 * @returns a fresh home file
 */
export function multipointHome(): JsonObject {
  const home = validBaseHome();
  setAt(home, 'name', 'Multipoint house');
  setAt(home, 'leakageTest', {
    points: MULTIPOINT_READINGS.map((point) => ({ ...point })),
    testedOn: '2024-02-12',
    note: 'five readings, depressurised',
  });
  return home;
}

/**
 * A home with an earlier test-in and two test-outs (one a multipoint test) beside the test-in
 * the plan is built on, which is the latest dated one.
 *
 * @returns a fresh home file
 */
export function testOutsHome(): JsonObject {
  const home = validBaseHome();
  setAt(home, 'name', 'Tested-out house');
  setAt(home, 'leakageTest', { cfm50: 3200, exponentN: 0.62, testedOn: '2024-03-04' });
  setAt(home, 'otherLeakageTests', [
    {
      kind: 'testIn',
      cfm50: 3650,
      testedOn: '2023-10-01',
      note: 'before the furnace was replaced',
    },
    { kind: 'testOut', cfm50: 2480, testedOn: '2024-05-20' },
    {
      kind: 'testOut',
      points: [
        { pa: 50, cfm: 2400 },
        { pa: 25, cfm: 1570 },
        { pa: 15, cfm: 1130 },
      ],
      testedOn: '2024-06-01',
      note: 'after the rim joists',
    },
  ]);
  return home;
}

/**
 * A home whose measures carry every optional field: done, declined, health and safety, a
 * location other than the library's, notes, a markup.
 *
 * @returns a fresh home file
 */
export function measureStatusesHome(): JsonObject {
  const home = validBaseHome();
  setAt(home, 'name', 'Half-done house');
  setAt(home, 'measures', [
    {
      id: 'rim',
      type: 'rim-joist',
      location: 'wall',
      reductionCfm50: { low: 100, likely: 180, high: 260 },
      cost: { materialsUsd: 140, laborHours: 6, laborRateUsdPerHour: 55, markupFraction: 0.2 },
      lifeYears: 25,
      status: 'done',
      note: 'sealed in May',
    },
    {
      id: 'hatch',
      type: 'attic-hatch',
      byUnits: { units: 1 },
      cost: { materialsUsd: 35, laborHours: 1, laborRateUsdPerHour: 55 },
      status: 'declined',
      note: 'owner will do it',
    },
    {
      id: 'flue-chase',
      type: 'attic-chases',
      shareOfLocation: { share: { low: 0.05, likely: 0.1, high: 0.15 } },
      cost: {
        materialsUsd: 60,
        laborHours: 2,
        laborRateUsdPerHour: 55,
        healthAndSafety: true,
      },
    },
  ]);
  return home;
}

/**
 * A home with a client, a full address and notes.
 *
 * @param client - the client as the file names them
 * @returns a fresh home file
 */
export function clientHome(
  client: { name: string; email?: string; phone?: string } = {
    name: 'Ida Marchetti',
    email: 'ida@example.org',
    phone: '555-0142',
  },
): JsonObject {
  const home = validBaseHome();
  setAt(home, 'name', 'Client house');
  setAt(home, 'client', { ...client });
  setAt(home, 'address', {
    street: '12 Tinsmith Row',
    town: 'Eastwick Mills',
    region: 'NY',
    postalCode: '12999',
  });
  setAt(home, 'notes', 'Dog in the yard; call before coming.');
  return home;
}

/**
 * A home using the LBL basic method with no cooling, given leak shares, a leakage floor,
 * a grid CO2 factor and a loan.
 *
 * @returns a fresh home file
 */
export function assumptionsHome(): JsonObject {
  const home = validBaseHome();
  setAt(home, 'name', 'Assumptions house');
  setAt(home, 'infiltrationMethod', 'lblBasic');
  setAt(home, 'cooling', null);
  setAt(home, 'leakShares', { ceiling: 0.35, wall: 0.35, floor: 0.25, flue: 0.05 });
  setAt(home, 'leakageFloorCfm50', 900);
  setAt(home, 'emissions', { electricityKgCo2PerKwh: 0.4 });
  setAt(home, 'financing', { aprNominal: 0.05, months: 60 });
  return home;
}

/** Every hand-built home, by what it stresses. */
export function handHomes(): { what: string; file: JsonObject }[] {
  return [
    { what: 'a multipoint test-in', file: multipointHome() },
    { what: 'an earlier test-in and two test-outs', file: testOutsHome() },
    { what: 'measures done, declined and health-and-safety', file: measureStatusesHome() },
    { what: 'a client, an address and notes', file: clientHome() },
    { what: 'the LBL basic method with every optional assumption', file: assumptionsHome() },
  ];
}
