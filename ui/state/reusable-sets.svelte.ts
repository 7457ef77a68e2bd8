/**
 * The project's stored climates and price sets, which several homes can share: listed for
 * the House section's "figures from" choice, and added to when an auditor keeps a home's own
 * figures for other homes.
 */
import { call } from '../bridge.ts';
import type { ChannelResponse } from '../../electron/channels.ts';

export type StoredClimate = ChannelResponse<'climates.list'>[number];
export type StoredPriceSet = ChannelResponse<'priceSets.list'>[number];

export class ReusableSets {
  climates = $state.raw<readonly StoredClimate[]>([]);
  priceSets = $state.raw<readonly StoredPriceSet[]>([]);
  failure = $state<string | null>(null);

  async load(): Promise<void> {
    const [climates, priceSets] = await Promise.all([
      call('climates.list', {}),
      call('priceSets.list', {}),
    ]);
    if (climates.ok) this.climates = climates.value;
    if (priceSets.ok) this.priceSets = priceSets.value;
    this.failure = !climates.ok
      ? climates.error.message
      : !priceSets.ok
        ? priceSets.error.message
        : null;
  }

  climate(id: number | null): StoredClimate | undefined {
    return this.climates.find((set) => set.id === id);
  }

  priceSet(id: number | null): StoredPriceSet | undefined {
    return this.priceSets.find((set) => set.id === id);
  }
}
