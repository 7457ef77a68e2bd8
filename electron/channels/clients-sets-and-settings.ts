/**
 * The channels of what a project keeps beside its homes: clients, the stored climates and
 * price sets homes link to, and the project's settings.
 */
import { z } from 'zod';
import {
  climateFromWeather,
  detectAndParseWeather,
  detectWeatherFormat,
} from '../../core/weather.ts';
import type { Climate, HomeFile } from '../../core/schema.ts';
import { createClient, listClients, type Client } from '../../db/repositories/clients.ts';
import { climates, priceSets, type NamedSet } from '../../db/repositories/reusable-sets.ts';
import { getSettings, settingsSchema, updateSettings } from '../../db/repositories/settings.ts';
import {
  createWeatherYear,
  linkClimateWeatherYear,
  weatherYearSummaryOfClimate,
  type WeatherYearSummary,
} from '../../db/repositories/weather-years.ts';
import { weatherYearOfHome } from '../../db/evaluation-inputs.ts';
import { exportHomeFile } from '../../db/home-file.ts';
import { weatherYearData, type WeatherYearData } from '../../core/weather.ts';
import { byId, channel, id, nothing, recordOf } from './_define.ts';

const namedSet = z.strictObject({ name: z.string().max(200), data: z.unknown() });

/**
 * The save channel of one kind of stored set (climates, price sets): a request without an id
 * creates a set, one with an id renames and replaces that set.
 *
 * @param sets - the repository of that kind of set
 * @returns the channel, replying with the set's id
 */
function saveChannel(sets: Pick<typeof climates, 'create' | 'update'>) {
  return channel({
    request: namedSet.extend({ id: id.optional() }),
    response: byId,
    handle: ({ store }, request) => ({
      id: store.write((write) => {
        if (request.id === undefined) return sets.create(write, request.name, request.data);
        sets.update(write, request.id, request.name, request.data);
        return request.id;
      }),
    }),
  });
}

/** The `clients.*`, `climates.*`, `priceSets.*` and `settings.*` channels. */
export const clientSetAndSettingChannels = {
  'clients.list': channel({
    request: nothing,
    response: z.array(recordOf<Client>()),
    handle: ({ store }) => store.read((read) => listClients(read)),
  }),
  'clients.create': channel({
    request: z.strictObject({
      name: z.string().max(200),
      phone: z.string().max(50).optional(),
      email: z.string().max(200).optional(),
    }),
    response: byId,
    handle: ({ store }, input) => ({ id: store.write((write) => createClient(write, input)) }),
  }),
  'climates.list': channel({
    request: nothing,
    response: z.array(recordOf<NamedSet<Climate>>()),
    handle: ({ store }) => store.read((read) => climates.list(read)),
  }),
  'climates.save': saveChannel(climates),
  // A climate made from an hourly weather file (EPW or TMY3), stored with the file's hours.
  'climates.importWeather': channel({
    request: z.strictObject({
      text: z.string().max(8 * 1024 * 1024),
      fileName: z.string().max(300).optional(),
      name: z.string().trim().min(1).max(200).optional(),
    }),
    response: z.strictObject({ id, climate: recordOf<Climate>() }),
    handle: ({ store }, request) => {
      const weather = detectAndParseWeather(request.text, request.fileName);
      // The reader above chose the format by the same test, so it is known here.
      const format = detectWeatherFormat(request.text) ?? 'epw';
      const climate = climateFromWeather(weather, request.name);
      // The climate and the hours it came from are stored together or not at all.
      const climateId = store.write((write) => {
        const made = climates.create(write, climate.name, climate);
        const yearId = createWeatherYear(write, { name: climate.name, format, weather });
        linkClimateWeatherYear(write, made, yearId);
        return made;
      });
      return { id: climateId, climate };
    },
  }),
  // What hours a climate keeps (it was made from a weather file), or null.
  'climates.hoursOf': channel({
    request: z.strictObject({ climateId: id }),
    response: recordOf<WeatherYearSummary>().nullable(),
    handle: ({ store }, { climateId }) =>
      store.read((read) => weatherYearSummaryOfClimate(read, climateId)),
  }),
  // The year a home is planned hour by hour on, for the page's own workers; null on degree days.
  'climates.weatherYearOfHome': channel({
    request: z.strictObject({ homeId: id }),
    response: recordOf<WeatherYearData>().nullable(),
    handle: ({ store }, { homeId }) =>
      store.read((read) => {
        const year = weatherYearOfHome(read, homeId, exportHomeFile(read, homeId));
        return year ? weatherYearData(year) : null;
      }),
  }),
  'priceSets.list': channel({
    request: nothing,
    response: z.array(recordOf<NamedSet<HomeFile['prices']>>()),
    handle: ({ store }) => store.read((read) => priceSets.list(read)),
  }),
  'priceSets.save': saveChannel(priceSets),
  'settings.get': channel({
    request: nothing,
    response: settingsSchema,
    handle: ({ store }) => store.read((read) => getSettings(read)),
  }),
  'settings.update': channel({
    request: settingsSchema.partial(),
    response: settingsSchema,
    handle: ({ store }, patch) => store.write((write) => updateSettings(write, patch)),
  }),
} as const;
