/** 3 Larch Terrace, Petrel Ford: an invented demo home (see shared.ts). */
import type { HomeFileInput } from '../../../core/schema.ts';
import {
  ALDER_CREEK_CLIMATE,
  DEMO_TOWNS,
  ECONOMICS,
  EMISSIONS,
  PRICES,
  crewCost,
  demoAddress,
  demoNotes,
  range,
} from './shared.ts';

export const LARCH_TERRACE: HomeFileInput = {
  format: 'sealwork-home/1',
  name: '3 Larch Terrace: 2014 tight house, sealed-combustion gas',
  demo: true,
  address: demoAddress('3 Larch Terrace', DEMO_TOWNS.petrelFord),
  client: { name: 'Jonah Whitlock and Sung-min Bae', email: 'larch3@example.com' },
  notes: demoNotes(
    'Already tight, with no continuous ventilation: the bath fans run on switches only. Any sealing here calls for a fan first; the plan shows why the small measures do not pay.',
  ),
  house: {
    conditionedFloorAreaFt2: 2400,
    conditionedVolumeFt3: 21_600,
    stories: 2,
    heightFt: 19,
    bedrooms: 4,
    shelterClass: 4,
    foundation: 'basement',
    yearBuilt: 2014,
  },
  climate: ALDER_CREEK_CLIMATE,
  heating: {
    fuel: 'naturalGas',
    equipment: 'furnace',
    efficiency: 0.95,
    distributionEfficiency: 0.95,
    combustionVenting: 'sealed',
  },
  cooling: { seer: 16, distributionEfficiency: 0.95 },
  prices: PRICES,
  economics: ECONOMICS,
  infiltrationMethod: 'aim2',
  leakageTest: { cfm50: 1150, testedOn: '2026-04-02' },
  ventilation: { existingFanCfm: 0, fanType: 'exhaust', fanCostUsd: 520 },
  emissions: EMISSIONS,
  measures: [
    {
      id: 'larch-hatch',
      type: 'attic-hatch',
      reductionCfm50: range(40, 70, 100),
      cost: crewCost(60, 1.5),
    },
    {
      id: 'larch-rim',
      type: 'rim-joist',
      reductionCfm50: range(60, 110, 160),
      cost: crewCost(220, 5),
    },
    {
      id: 'larch-penetrations',
      type: 'plumbing-penetrations',
      byUnits: { units: 6 },
      cost: crewCost(20, 1),
    },
  ],
};
