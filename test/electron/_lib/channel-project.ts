/**
 * A real project file in a temporary folder, opened as the hosts open it (db/project.ts with
 * the demo), with a clock that moves one second per write so a write that slipped through
 * always changes a timestamp; plus the rows the valid requests refer to.
 */
import { join } from 'node:path';
import { expect } from 'vitest';
import { callChannel, type ChannelContext, type Reply } from '../../../electron/channels.ts';
import { openProject } from '../../../db/project.ts';
import type { Store } from '../../../db/store.ts';
import { makeTempFolder, type TempFolder } from '../../_lib/cli-harness.ts';
import { pngImage } from '../../_lib/photo-bytes.ts';
import { baseHomeInput, type KnownIds } from './channel-requests.ts';

/** An open project and the folder it lives in. */
export interface ChannelProject {
  folder: TempFolder;
  store: Store;
  context: ChannelContext;
  close(): void;
}

/**
 * The value of a reply that must have succeeded.
 *
 * @param reply - a channel's reply
 * @returns its value (the test fails with the error otherwise)
 */
export function valueOf<Value>(reply: Reply<Value>): Value {
  if (!reply.ok) expect.fail(`expected ok, got ${JSON.stringify(reply.error)}`);
  return reply.value;
}

/**
 * Opens a new project file with the demo homes.
 *
 * @param prefix - the start of the temporary folder's name
 * @returns the project; `close()` closes it and removes the folder
 */
export function openChannelProject(prefix: string): ChannelProject {
  const folder = makeTempFolder(prefix);
  let seconds = 0;
  const clock = () => new Date(Date.UTC(2025, 0, 1) + 1000 * (seconds += 1));
  const { store } = openProject(join(folder.path, 'project.db'), { demoWhenNew: true, clock });
  return {
    folder,
    store,
    context: { store },
    close() {
      store.close();
      folder.remove();
    },
  };
}

/**
 * Adds, through the channels, one of each row the valid requests refer to: a client, a home
 * with a test-in, a measure and a photo, a saved plan, a climate and a price set.
 *
 * @param context - the project's channel context
 * @returns their ids
 */
export function addKnownRows(context: ChannelContext): KnownIds {
  const clientId = valueOf(callChannel(context, 'clients.create', { name: 'Known Client' })).id;
  const homeId = valueOf(callChannel(context, 'homes.create', baseHomeInput(clientId))).id;
  const testId = valueOf(
    callChannel(context, 'tests.add', { homeId, test: { kind: 'testIn', cfm50: 3200 } }),
  ).id;
  const measure = {
    id: 'known-m1',
    type: 'rim-joist',
    reductionCfm50: { low: 100, likely: 150, high: 200 },
    cost: { materialsUsd: 70, laborHours: 4, laborRateUsdPerHour: 50 },
  };
  const measureId = valueOf(callChannel(context, 'measures.add', { homeId, measure })).id;
  const planId = valueOf(callChannel(context, 'plans.save', { homeId, name: 'Known plan' })).id;
  const home = valueOf(callChannel(context, 'homeFile.export', { id: homeId }));
  const climateId = valueOf(
    callChannel(context, 'climates.save', { name: 'Known climate', data: home.climate }),
  ).id;
  const priceSetId = valueOf(
    callChannel(context, 'priceSets.save', { name: 'Known prices', data: home.prices }),
  ).id;
  const photoId = valueOf(
    callChannel(context, 'photos.add', {
      homeId,
      kind: 'other',
      base64: pngImage(4, 4, 1).toString('base64'),
    }),
  ).id;
  return { homeId, testId, measureId, planId, climateId, priceSetId, clientId, photoId };
}
