/**
 * The names of the channels, on their own so the preload (bundled into the sandboxed page)
 * knows them without pulling in the core or the database. `channels.ts` checks that its
 * table has exactly these names.
 */
export const CHANNEL_NAMES = [
  'homes.list',
  'homes.get',
  'homes.create',
  'homes.update',
  'homes.delete',
  'homes.restore',
  'homes.purge',
  'homes.duplicate',
  'tests.add',
  'tests.update',
  'tests.delete',
  'measures.add',
  'measures.update',
  'measures.delete',
  'plan.evaluate',
  'plan.explain',
  'plan.compareDegreeDays',
  'plans.save',
  'plans.list',
  'plans.get',
  'library.list',
  'library.shipped',
  'library.saveEdit',
  'library.reset',
  'plan.options',
  'clients.list',
  'clients.create',
  'climates.list',
  'climates.save',
  'climates.importWeather',
  'climates.hoursOf',
  'climates.weatherYearOfHome',
  'priceSets.list',
  'priceSets.save',
  'settings.get',
  'settings.update',
  'homeFile.import',
  'homeFile.export',
  'homeFile.evaluate',
  'portfolio.summary',
  'portfolio.evaluate',
  'portfolio.homeFiles',
  'portfolio.applyCalibration',
  'portfolio.removeCalibration',
  'portfolio.checkCsv',
  'portfolio.importCsv',
  'portfolio.homesCsv',
  'portfolio.resultsCsv',
  'bills.list',
  'bills.import',
  'bills.importTemperatures',
  'bills.analyse',
  'bills.clear',
] as const;

export type ChannelNameList = (typeof CHANNEL_NAMES)[number];

/** The IPC name of a channel in the desktop app. */
export function ipcName(channel: string): string {
  return `sealwork:${channel}`;
}
