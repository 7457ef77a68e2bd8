/** 208 Quarry Road, Stonecrop: an invented demo home (see shared.ts). */
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

export const QUARRY_ROAD: HomeFileInput = {
  format: 'sealwork-home/1',
  name: '208 Quarry Road: 1956 ranch, natural-draft gas furnace',
  demo: true,
  address: demoAddress('208 Quarry Road', DEMO_TOWNS.stonecrop),
  client: { name: 'Raymond and Lucille Petrakis', phone: '555-0117' },
  notes: demoNotes(
    'Ranch over a full basement; furnace and water heater share a masonry chimney. Eight old recessed cans in the kitchen ceiling, not rated for contact with insulation.',
  ),
  house: {
    conditionedFloorAreaFt2: 1240,
    conditionedVolumeFt3: 9_900,
    stories: 1,
    heightFt: 10,
    bedrooms: 3,
    shelterClass: 3,
    foundation: 'basement',
    yearBuilt: 1956,
  },
  climate: ALDER_CREEK_CLIMATE,
  heating: {
    fuel: 'naturalGas',
    equipment: 'furnace',
    efficiency: 0.8,
    distributionEfficiency: 0.85,
    combustionVenting: 'naturalDraft',
  },
  cooling: { seer: 10, distributionEfficiency: 0.85 },
  prices: PRICES,
  economics: ECONOMICS,
  infiltrationMethod: 'nFactor',
  leakageTest: { cfm50: 3100, testedOn: '2026-01-22' },
  combustionAppliances: [
    { kind: 'waterHeater', fuel: 'naturalGas', venting: 'naturalDraft' },
    { kind: 'range', fuel: 'naturalGas', venting: 'none' },
  ],
  emissions: EMISSIONS,
  measures: [
    { id: 'quarry-cans', type: 'recessed-lights', byUnits: { units: 8 }, cost: crewCost(176, 4) },
    {
      id: 'quarry-top-plates',
      type: 'attic-top-plates',
      reductionCfm50: range(250, 400, 560),
      cost: crewCost(95, 6),
    },
    { id: 'quarry-boots', type: 'duct-boots', byUnits: { units: 9 }, cost: crewCost(40, 2.5) },
    {
      id: 'quarry-rim',
      type: 'rim-joist',
      reductionCfm50: range(120, 220, 320),
      cost: crewCost(210, 5),
    },
    {
      id: 'quarry-doors',
      type: 'door-weatherstrip',
      byUnits: { units: 2 },
      cost: crewCost(70, 2),
    },
    {
      id: 'quarry-dryer',
      type: 'dryer-vent',
      reductionCfm50: range(20, 40, 60),
      cost: crewCost(48, 1.5),
    },
  ],
};
