/**
 * The channels of a home's bills and daily temperatures, and of its billing analysis
 * (core/billing.ts through channels/bills-analysis.ts).
 */
import { z } from 'zod';
import { parseBillsCsv, parseTemperaturesCsv, type CsvProblem } from '../../core/billing.ts';
import { FUELS } from '../../core/schema.ts';
import {
  clearBills,
  listBills,
  replaceBills,
  replaceDailyTemperatures,
  temperatureSpan,
  type BillRecord,
} from '../../db/repositories/bills.ts';
import type { WeatherYearSummary } from '../../db/repositories/weather-years.ts';
import { analyseBills, weatherYearOfHome, type BillsAnalysis } from './bills-analysis.ts';
import { channel, id, recordOf } from './_define.ts';

/** The most characters a bills or temperatures file may have (ten years of days is ~0.2 MB). */
const MAX_BILLING_CSV_CHARS = 2 * 1024 * 1024;
const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'expected a date as YYYY-MM-DD');
const csvRequest = z.strictObject({ homeId: id, csv: z.string().max(MAX_BILLING_CSV_CHARS) });
const problemsSchema = z.array(recordOf<CsvProblem>());

/** The `bills.*` channels. */
export const billChannels = {
  // The home's bills, the span of its daily temperatures and its climate's weather year.
  'bills.list': channel({
    request: z.strictObject({ homeId: id }),
    response: z.strictObject({
      bills: z.array(recordOf<BillRecord>()),
      temperatures: z.strictObject({
        days: z.int().min(0),
        first: z.string().nullable(),
        last: z.string().nullable(),
      }),
      weatherYear: recordOf<WeatherYearSummary>().nullable(),
    }),
    handle: ({ store }, request) =>
      store.read((read) => ({
        bills: listBills(read, request.homeId),
        temperatures: temperatureSpan(read, request.homeId),
        weatherYear: weatherYearOfHome(read, request.homeId),
      })),
  }),
  // A bills CSV: its bills replace the home's bills of the fuels it holds; any problem, none stored.
  'bills.import': channel({
    request: csvRequest,
    response: z.strictObject({
      count: z.int().min(0),
      fuels: z.array(z.enum(FUELS)),
      problems: problemsSchema,
    }),
    handle: ({ store }, request) => {
      const parsed = parseBillsCsv(request.csv);
      if (!parsed.ok) return { count: 0, fuels: [], problems: parsed.problems };
      const fuels = store.write((write) => replaceBills(write, request.homeId, parsed.bills));
      return { count: parsed.bills.length, fuels, problems: [] };
    },
  }),
  // A daily means CSV (°F or °C): replaces the home's series; any problem, none stored.
  'bills.importTemperatures': channel({
    request: csvRequest,
    response: z.strictObject({ days: z.int().min(0), problems: problemsSchema }),
    handle: ({ store }, request) => {
      const parsed = parseTemperaturesCsv(request.csv);
      if (!parsed.ok) return { days: 0, problems: parsed.problems };
      const days = store.write((write) =>
        replaceDailyTemperatures(write, request.homeId, parsed.temperatures),
      );
      return { days, problems: [] };
    },
  }),
  'bills.analyse': channel({
    request: z.strictObject({
      homeId: id,
      workDone: isoDate,
      fuel: z.enum(FUELS).optional(),
      kind: z.enum(['heating', 'cooling']).optional(),
      temperatures: z.enum(['stored', 'weatherYear']).optional(),
    }),
    response: recordOf<BillsAnalysis>(),
    handle: ({ store }, request) => store.read((read) => analyseBills(read, request)),
  }),
  'bills.clear': channel({
    request: z.strictObject({
      homeId: id,
      fuel: z.enum(FUELS).optional(),
      temperatures: z.boolean().optional(),
    }),
    response: z.strictObject({ bills: z.int().min(0), days: z.int().min(0) }),
    handle: ({ store }, request) =>
      store.write((write) =>
        clearBills(write, request.homeId, {
          ...(request.fuel === undefined ? {} : { fuel: request.fuel }),
          ...(request.temperatures === undefined ? {} : { temperatures: request.temperatures }),
        }),
      ),
  }),
} as const;
