/** 77 Old Mill Road, Alder Creek: an invented demo home (see shared.ts). */
import type { HomeFileInput } from '../../../core/schema.ts';
import {
  ALDER_CREEK_CLIMATE,
  DEMO_TOWNS,
  PRICES,
  crewCost,
  demoAddress,
  demoNotes,
  range,
} from './shared.ts';

export const OLD_MILL_ROAD: HomeFileInput = {
  format: 'sealwork-home/1',
  name: '77 Old Mill Road: 1938 bungalow with kneewalls, gas boiler',
  demo: true,
  address: demoAddress('77 Old Mill Road', DEMO_TOWNS.alderCreek),
  client: { name: 'Ezekiel Boateng', phone: '555-0188' },
  notes: demoNotes(
    'Storey-and-a-half bungalow on a sheltered, tree-lined lot. Loose-fill that looks like vermiculite behind the kneewalls: the sample is out for testing. Open fireplace with a damper that no longer closes.',
  ),
  house: {
    conditionedFloorAreaFt2: 1420,
    conditionedVolumeFt3: 11_300,
    stories: 1.5,
    heightFt: 16,
    bedrooms: 2,
    shelterClass: 5,
    foundation: 'basement',
    yearBuilt: 1938,
    vermiculiteSuspected: true,
  },
  climate: ALDER_CREEK_CLIMATE,
  heating: {
    fuel: 'naturalGas',
    equipment: 'boiler',
    efficiency: 0.82,
    distributionEfficiency: 0.92,
    combustionVenting: 'naturalDraft',
  },
  cooling: null,
  prices: PRICES,
  economics: { discountRateReal: 0.03, ranking: 'payback' },
  infiltrationMethod: 'nFactor',
  nFactorOverride: 17.5,
  leakageTest: { cfm50: 3900, testedOn: '2026-02-24' },
  combustionAppliances: [{ kind: 'fireplace', fuel: 'wood', venting: 'naturalDraft' }],
  measures: [
    {
      id: 'oldmill-kneewalls',
      type: 'kneewalls',
      reductionCfm50: range(300, 480, 650),
      cost: crewCost(240, 9),
    },
    {
      id: 'oldmill-plumbing-chase',
      type: 'plumbing-chase',
      reductionCfm50: range(100, 180, 260),
      cost: crewCost(70, 3),
    },
    {
      id: 'oldmill-fireplace',
      type: 'fireplace-damper',
      reductionCfm50: range(100, 200, 300),
      cost: crewCost(250, 1.5),
    },
    {
      id: 'oldmill-doors',
      type: 'door-weatherstrip',
      byUnits: { units: 3 },
      cost: crewCost(95, 3),
    },
    {
      id: 'oldmill-sill',
      type: 'sill-plate',
      reductionCfm50: range(70, 130, 200),
      cost: crewCost(55, 3.5),
    },
    {
      id: 'oldmill-wiring',
      type: 'wiring-penetrations',
      byUnits: { units: 6 },
      cost: crewCost(40, 2, true),
      note: 'Done with the electrical safety repair, paid from the health-and-safety budget.',
    },
  ],
};
