/** 9 Fernbank Way, Petrel Ford: an invented demo home (see shared.ts). */
import type { HomeFileInput } from '../../../core/schema.ts';
import {
  ALDER_CREEK_CLIMATE,
  DEMO_TOWNS,
  EMISSIONS,
  PRICES,
  crewCost,
  demoAddress,
  demoNotes,
  range,
} from './shared.ts';

export const FERNBANK_WAY: HomeFileInput = {
  format: 'sealwork-home/1',
  name: '9 Fernbank Way: 1996 slab house, propane furnace, attic ducts',
  demo: true,
  address: demoAddress('9 Fernbank Way', DEMO_TOWNS.petrelFord),
  client: { name: 'Carmen Echevarria-Ruiz', phone: '555-0163' },
  notes: demoNotes(
    'Single-storey house on a slab; furnace in the garage-side closet, supply ducts and fourteen recessed cans in the attic. The client asked for a financed package.',
  ),
  house: {
    conditionedFloorAreaFt2: 2050,
    conditionedVolumeFt3: 18_450,
    stories: 1,
    heightFt: 11,
    bedrooms: 3,
    shelterClass: 2,
    foundation: 'slab',
    yearBuilt: 1996,
  },
  climate: ALDER_CREEK_CLIMATE,
  heating: {
    fuel: 'propane',
    equipment: 'furnace',
    efficiency: 0.92,
    distributionEfficiency: 0.78,
    combustionVenting: 'inducedDraft',
  },
  cooling: { seer: 14, distributionEfficiency: 0.78 },
  prices: PRICES,
  economics: { discountRateReal: 0.03, ranking: 'npv' },
  infiltrationMethod: 'ashrae622',
  leakageTest: { cfm50: 3500, testedOn: '2026-03-18' },
  emissions: EMISSIONS,
  financing: { aprNominal: 0.049, months: 60 },
  measures: [
    {
      id: 'fern-top-plates',
      type: 'attic-top-plates',
      reductionCfm50: range(180, 300, 420),
      cost: crewCost(110, 6),
    },
    { id: 'fern-cans', type: 'recessed-lights', byUnits: { units: 14 }, cost: crewCost(300, 5) },
    { id: 'fern-boots', type: 'duct-boots', byUnits: { units: 12 }, cost: crewCost(50, 3) },
    {
      id: 'fern-garage',
      type: 'garage-house-wall',
      reductionCfm50: range(60, 110, 170),
      cost: crewCost(90, 4),
    },
    {
      id: 'fern-fans',
      type: 'exhaust-fan-vents',
      byUnits: { units: 3 },
      cost: crewCost(60, 1.5),
    },
  ],
};
