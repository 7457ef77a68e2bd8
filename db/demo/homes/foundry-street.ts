/** 318 Foundry Street, unit B, Alder Creek: an invented demo home (see shared.ts). */
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

export const FOUNDRY_STREET: HomeFileInput = {
  format: 'sealwork-home/1',
  name: '318 Foundry Street, unit B: 1963 duplex half, gas boiler',
  demo: true,
  address: demoAddress('318 Foundry Street, unit B', DEMO_TOWNS.alderCreek),
  client: { name: 'Nadia Haddad', phone: '555-0176' },
  notes: demoNotes(
    'Owner-occupied half of a side-by-side duplex on a close-set street. The attic is shared over both halves and the party wall is open to it. The neighbour’s half was not pressurized during the test, so some of the leakage measured runs through the party wall to unit A.',
  ),
  house: {
    conditionedFloorAreaFt2: 1150,
    conditionedVolumeFt3: 9_300,
    stories: 2,
    heightFt: 18,
    bedrooms: 2,
    shelterClass: 4,
    foundation: 'basement',
    yearBuilt: 1963,
  },
  climate: ALDER_CREEK_CLIMATE,
  heating: {
    fuel: 'naturalGas',
    equipment: 'boiler',
    efficiency: 0.8,
    distributionEfficiency: 0.92,
    combustionVenting: 'naturalDraft',
  },
  cooling: null,
  prices: PRICES,
  economics: ECONOMICS,
  infiltrationMethod: 'lblBasic',
  leakageTest: {
    points: [
      { pa: 15, cfm: 1120 },
      { pa: 22, cfm: 1435 },
      { pa: 29, cfm: 1665 },
      { pa: 36, cfm: 1920 },
      { pa: 43, cfm: 2100 },
      { pa: 50, cfm: 2350 },
    ],
    testedOn: '2026-04-21',
  },
  combustionAppliances: [
    { kind: 'waterHeater', fuel: 'naturalGas', venting: 'naturalDraft' },
    { kind: 'range', fuel: 'naturalGas', venting: 'none' },
  ],
  emissions: EMISSIONS,
  measures: [
    {
      id: 'foundry-party-wall',
      type: 'attic-chases',
      reductionCfm50: range(120, 220, 320),
      cost: crewCost(150, 6),
      note: 'Party-wall cavity capped at the attic floor with rigid board, edges sealed.',
    },
    {
      id: 'foundry-top-plates',
      type: 'attic-top-plates',
      reductionCfm50: range(150, 250, 350),
      cost: crewCost(90, 5),
    },
    {
      id: 'foundry-hatch',
      type: 'attic-hatch',
      byUnits: { units: 1 },
      cost: crewCost(40, 1),
    },
    {
      id: 'foundry-rim',
      type: 'rim-joist',
      shareOfLocation: { share: range(0.2, 0.3, 0.45) },
      cost: crewCost(120, 3.5),
    },
    {
      id: 'foundry-range-hood',
      type: 'range-hood-damper',
      byUnits: { units: 1 },
      cost: crewCost(35, 1),
    },
    {
      id: 'foundry-gaskets',
      type: 'electrical-box-gaskets',
      byUnits: { units: 18 },
      cost: crewCost(30, 2),
      status: 'declined',
      note: 'Declined by the client: the outlets are to be replaced when the house is rewired next year.',
    },
  ],
};
