/**
 * One valid request for every channel of the table, with every optional field it can carry
 * filled in (so the corpus breaks each of them), and the schemas of the `z.unknown()` fields
 * that the handlers check themselves. The type makes a new channel without a request here a
 * compile error. The house is the invented base house of test/_lib/base-home.ts.
 */
import { billingScenario, billsCsv, temperaturesCsv } from '../../_lib/billing-files.ts';
import { pngImage } from '../../_lib/photo-bytes.ts';
import { tmy3Year } from '../../_lib/weather-files.ts';
import type { ChannelName, ChannelRequest } from '../../../electron/channels.ts';
import { measureTypeEditSchema } from '../../../core/measure-library.ts';
import { climateSchema, homeFileSchema, pricesSchema } from '../../../core/schema.ts';
import type { HomeInput } from '../../../db/repositories/homes.ts';
import { validBaseHome, type JsonObject } from '../../_lib/base-home.ts';
import { jsonSchemaOf, type JsonSchema } from './request-schema.ts';

/** Rows the valid requests refer to (they need not exist for the requests to parse). */
export interface KnownIds {
  homeId: number;
  testId: number;
  measureId: number;
  planId: number;
  climateId: number;
  priceSetId: number;
  clientId: number;
  /** A photo of the known home (a PNG made by test/_lib/photo-bytes.ts). */
  photoId: number;
}

/** A valid request for each channel. */
export type ValidRequests = { [Name in ChannelName]: ChannelRequest<Name> };

/** The shipped measure type the library requests edit. */
export const EDITED_TYPE_ID = 'attic-top-plates';

/**
 * The base house as a home's input (the parts a home row keeps), every optional part filled.
 *
 * @param clientId - the client to link, or null
 * @returns a fresh copy
 */
export function baseHomeInput(clientId: number | null): HomeInput {
  const {
    format: _format,
    name: _name,
    measures: _measures,
    leakageTest: _leakageTest,
    ...data
  } = validBaseHome();
  return {
    name: 'Channel test house',
    clientId,
    climateId: null,
    priceSetId: null,
    address: { street: '12 Test Lane', town: 'Testford', region: 'TS', postalCode: '00000' },
    isDemo: false,
    notes: 'entered by the channel tests',
    jobStatus: 'approved',
    data: {
      ...(data as unknown as HomeInput['data']),
      nFactorOverride: 18,
      leakShares: { ceiling: 0.4, wall: 0.3, floor: 0.2, flue: 0.1 },
      leakageFloorCfm50: 500,
      emissions: { electricityKgCo2PerKwh: 0.4 },
      financing: { aprNominal: 0.05, months: 60 },
    },
  };
}

/**
 * The base house as a home file with a client, an address and a test-out.
 *
 * @returns a fresh copy
 */
export function baseHomeFile(): JsonObject {
  return {
    ...validBaseHome(),
    demo: false,
    address: { street: '12 Test Lane', town: 'Testford', postalCode: '00000' },
    client: { name: 'Test Client', phone: '555-0100', email: 'client@example.com' },
    notes: 'imported by the channel tests',
    otherLeakageTests: [
      {
        kind: 'testOut',
        points: [
          { pa: 50, cfm: 2600 },
          { pa: 25, cfm: 1700 },
        ],
        testedOn: '2024-06-02',
      },
    ],
  };
}

/** A measure with every optional field, estimated directly. */
function directMeasure(): ChannelRequest<'measures.add'>['measure'] {
  return {
    id: 'channel-m1',
    type: 'attic-top-plates',
    location: 'ceiling',
    reductionCfm50: { low: 100, likely: 200, high: 300 },
    cost: {
      materialsUsd: 80,
      laborHours: 4,
      laborRateUsdPerHour: 55,
      markupFraction: 0.1,
      healthAndSafety: false,
    },
    lifeYears: 20,
    status: 'planned',
    note: 'top plates over the kitchen',
  };
}

/** A measure estimated by units, with both library defaults overridden. */
function unitMeasure(): ChannelRequest<'measures.update'>['measure'] {
  return {
    id: 'channel-m2',
    type: 'recessed-lights',
    byUnits: {
      units: 6,
      leakageAreaIn2PerUnit: { low: 1, likely: 2, high: 3 },
      sealingEffectiveness: { low: 0.6, likely: 0.8, high: 0.9 },
    },
    cost: { materialsUsd: 60, laborHours: 3, laborRateUsdPerHour: 50 },
  };
}

/**
 * A valid request for every channel.
 *
 * @param ids - rows to refer to
 * @returns channel name → request (fresh objects on every call)
 */
export function validRequests(ids: KnownIds): ValidRequests {
  const base = validBaseHome();
  return {
    'homes.list': {
      search: 'Lane',
      town: 'Testford',
      heatingFuel: 'naturalGas',
      clientId: ids.clientId,
      jobStatus: 'audited',
      leakiness: 'leaky',
      sort: 'yearBuilt',
      descending: true,
      deleted: false,
      limit: 10,
      offset: 0,
    },
    'homes.get': { id: ids.homeId },
    'homes.create': baseHomeInput(ids.clientId),
    'homes.update': { id: ids.homeId, home: baseHomeInput(ids.clientId) },
    'homes.delete': { id: ids.homeId },
    'homes.restore': { id: ids.homeId },
    'homes.purge': { id: ids.homeId },
    'homes.duplicate': { id: ids.homeId, name: 'Copy of the channel test house' },
    'tests.add': {
      homeId: ids.homeId,
      test: { kind: 'testIn', cfm50: 3000, exponentN: 0.65, testedOn: '2024-05-01', note: 'n' },
    },
    'tests.update': {
      id: ids.testId,
      test: {
        kind: 'testOut',
        points: [
          { pa: 50, cfm: 2500 },
          { pa: 25, cfm: 1600 },
        ],
        testedOn: '2024-06-01',
        note: 'after the work',
      },
    },
    'tests.delete': { id: ids.testId },
    'measures.add': { homeId: ids.homeId, measure: directMeasure() },
    'measures.update': { id: ids.measureId, measure: unitMeasure() },
    'measures.delete': { id: ids.measureId },
    'plan.evaluate': {
      homeId: ids.homeId,
      draws: 200,
      seed: 7,
      budget: { budgetUsd: 1500, objective: 'npv', packageSirAtLeastOne: true },
    },
    // The measure the measures.add request adds (the corpus runs it before this one).
    'plan.explain': { homeId: ids.homeId, measureId: directMeasure().id },
    'plan.compareDegreeDays': { homeId: ids.homeId },
    'plan.options': { homeId: ids.homeId, firstStepShare: 0.5, draws: 200, seed: 7 },
    'plans.save': { homeId: ids.homeId, name: 'Plan for the channel tests' },
    'plans.list': { homeId: ids.homeId },
    'plans.get': { id: ids.planId },
    'library.list': {},
    'library.shipped': {},
    'library.saveEdit': {
      typeId: EDITED_TYPE_ID,
      edit: {
        name: 'Top plates (program figures)',
        defaultLifeYears: 25,
        leakageAreaIn2PerUnit: { low: 1, likely: 2, high: 4 },
        sealingEffectiveness: { low: 0.5, likely: 0.7, high: 0.9 },
        defaultCost: { materialsUsdPerUnit: 2, laborHoursPerUnit: 0.1 },
        note: 'program field data',
      },
    },
    'library.reset': { typeId: EDITED_TYPE_ID },
    'clients.list': {},
    'clients.create': { name: 'Channel Client', phone: '555-0101', email: 'c@example.com' },
    'climates.list': {},
    'climates.importWeather': {
      text: tmy3Year((day) => (day % 2 === 0 ? 5 : 30)),
      fileName: 'generated.csv',
      name: 'Channel test weather',
    },
    'climates.hoursOf': { climateId: ids.climateId },
    'climates.weatherYearOfHome': { homeId: ids.homeId },
    'climates.save': { id: ids.climateId, name: 'Channel climate', data: base.climate },
    'priceSets.list': {},
    'priceSets.save': { id: ids.priceSetId, name: 'Channel prices', data: base.prices },
    'settings.get': {},
    'settings.update': {
      units: 'SI',
      discountRateReal: 0.04,
      ranking: 'npv',
      laborRateUsdPerHour: 60,
      markupFraction: 0.1,
      electricityKgCo2PerKwh: 0.4,
    },
    'homeFile.import': { file: baseHomeFile() },
    'homeFile.export': { id: ids.homeId },
    'homeFile.exportBundle': { id: ids.homeId },
    'homeFile.evaluate': { file: baseHomeFile() },
    'portfolio.summary': {},
    'portfolio.evaluate': { filter: { heatingFuel: 'naturalGas' } },
    'portfolio.homeFiles': { filter: { heatingFuel: 'naturalGas' } },
    'portfolio.applyCalibration': {
      filter: { town: 'Nowhere at all' },
      basis: { label: 'Channel test', date: '2026-11-30' },
    },
    'portfolio.removeCalibration': { filter: { town: 'Nowhere at all' } },
    'portfolio.checkCsv': { csv: PORTFOLIO_CSV },
    'portfolio.importCsv': { csv: PORTFOLIO_CSV },
    'portfolio.homesCsv': {},
    'portfolio.resultsCsv': {},
    'bills.list': { homeId: ids.homeId },
    'bills.import': { homeId: ids.homeId, csv: billsCsv(BILLING.bills) },
    'bills.importTemperatures': { homeId: ids.homeId, csv: temperaturesCsv(BILLING.temperatures) },
    // The bills and temperatures the two requests above store (the corpus runs them first).
    'bills.analyse': {
      homeId: ids.homeId,
      workDone: BILLING.workDone,
      fuel: 'naturalGas',
      kind: 'heating',
      temperatures: 'stored',
    },
    'bills.clear': { homeId: ids.homeId, fuel: 'naturalGas', temperatures: true },
    'jobs.history': { homeId: ids.homeId },
    // The known home is "approved" (baseHomeInput); the test-out below moves it on again.
    'jobs.changeStatus': {
      homeId: ids.homeId,
      to: 'inProgress',
      at: '2024-06-02T08:00:00Z',
      by: 'Channel tester',
      reason: 'crew booked',
    },
    'photos.list': { homeId: ids.homeId },
    'photos.add': {
      homeId: ids.homeId,
      // The measures.update request above makes the known measure channel-m2 (run first).
      measureId: unitMeasure().id,
      kind: 'before',
      caption: 'recessed lights before sealing',
      mediaType: 'image/png',
      base64: pngImage(6, 4, 2).toString('base64'),
    },
    'photos.get': { id: ids.photoId },
    'photos.remove': { id: ids.photoId },
    // channel-m1 (measures.add) is estimated directly in CFM50: its count is given here.
    'workOrder.get': {
      homeId: ids.homeId,
      measureIds: [directMeasure().id, unitMeasure().id],
      quantities: { [directMeasure().id]: 40 },
    },
    'workOrder.recordTestOut': {
      homeId: ids.homeId,
      cfm50: 2900,
      testedOn: '2024-06-03',
      by: 'Channel tester',
      measureIds: [directMeasure().id, unitMeasure().id],
      note: 'test-out after the work',
    },
  };
}

/** The made-up bills and temperatures of the bills requests. */
const BILLING = billingScenario();

/** A one-home portfolio CSV in the columns the README documents (made up for these tests). */
const PORTFOLIO_CSV = [
  'name,street,town,yearBuilt,floorAreaFt2,volumeFt3,stories,heightFt,bedrooms,shelterClass,foundation,hdd65F,cdd65F,elevationFt,nFactorZone,heatingFuel,heatingEquipment,heatingEfficiency,combustionVenting,seer,fuelPriceUsdPerUnit,electricityUsdPerKwh,cfm50',
  'Channel row,1 Test Way,Testford,1960,1400,11200,1,10,3,3,basement,6000,600,500,2,naturalGas,furnace,0.8,naturalDraft,,1.3,0.15,3000',
].join('\n');

/**
 * The schemas of the `z.unknown()` request fields that the handlers check, by channel and
 * dotted path; the corpus breaks these fields inside as well.
 *
 * @returns channel → path → JSON Schema
 */
export function handlerCheckedFields(): Partial<Record<ChannelName, Record<string, JsonSchema>>> {
  return {
    'homeFile.import': { file: jsonSchemaOf(homeFileSchema) },
    'homeFile.evaluate': { file: jsonSchemaOf(homeFileSchema) },
    'library.saveEdit': { edit: jsonSchemaOf(measureTypeEditSchema) },
    'climates.save': { data: jsonSchemaOf(climateSchema) },
    'priceSets.save': { data: jsonSchemaOf(pricesSchema) },
  };
}
