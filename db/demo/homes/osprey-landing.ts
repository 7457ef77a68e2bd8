/** 5 Osprey Landing, Petrel Ford: an invented demo home (see shared.ts). */
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
} from './shared.ts';

export const OSPREY_LANDING: HomeFileInput = {
  format: 'sealwork-home/1',
  name: '5 Osprey Landing: 1979 A-frame on the lakeshore, pellet stove',
  demo: true,
  address: demoAddress('5 Osprey Landing', DEMO_TOWNS.petrelFord),
  client: { name: 'Ana Lucía Quispe', email: 'alquispe@example.com' },
  notes: demoNotes(
    'A-frame on an open lakeshore lot, cathedral ceiling to the ridge with no attic to work from: every ceiling leak is sealed from below. The pellet stove heats the house; baseboards upstairs are a backup that is seldom used.',
  ),
  house: {
    conditionedFloorAreaFt2: 1200,
    conditionedVolumeFt3: 13_000,
    stories: 1.5,
    heightFt: 22,
    bedrooms: 2,
    shelterClass: 1,
    foundation: 'crawlspace',
    yearBuilt: 1979,
  },
  climate: ALDER_CREEK_CLIMATE,
  heating: {
    fuel: 'pellets',
    equipment: 'stove',
    efficiency: 0.75,
    combustionVenting: 'inducedDraft',
  },
  cooling: null,
  prices: PRICES,
  economics: ECONOMICS,
  infiltrationMethod: 'lblBasic',
  leakageTest: {
    points: [
      { pa: 12, cfm: 1245 },
      { pa: 20, cfm: 1765 },
      { pa: 28, cfm: 2275 },
      { pa: 36, cfm: 2675 },
      { pa: 44, cfm: 3125 },
    ],
    testedOn: '2026-09-15',
  },
  emissions: EMISSIONS,
  measures: [
    {
      id: 'osprey-cans',
      type: 'recessed-lights',
      byUnits: { units: 9 },
      cost: crewCost(220, 4),
      note: 'Airtight trims and gaskets fitted from below.',
    },
    {
      id: 'osprey-ceiling-wiring',
      type: 'wiring-penetrations',
      location: 'ceiling',
      byUnits: { units: 12 },
      cost: crewCost(25, 1.5),
      note: 'Fixture boxes and wire holes in the cathedral ceiling.',
    },
    {
      id: 'osprey-fan',
      type: 'exhaust-fan-vents',
      byUnits: { units: 1 },
      cost: crewCost(35, 1),
    },
    {
      id: 'osprey-baseboard',
      type: 'baseboard-sealing',
      byUnits: { units: 110 },
      cost: crewCost(60, 5),
    },
    {
      id: 'osprey-doors',
      type: 'door-weatherstrip',
      byUnits: { units: 2 },
      cost: crewCost(90, 2.5),
      note: 'The entry door and the sliding door to the deck.',
    },
    {
      id: 'osprey-gaskets',
      type: 'electrical-box-gaskets',
      byUnits: { units: 20 },
      cost: crewCost(30, 1.5),
    },
    {
      id: 'osprey-windows',
      type: 'window-sealing',
      byUnits: { units: 12 },
      cost: crewCost(100, 7),
    },
  ],
};
