/** 14 Kestrel Park Lane, Stonecrop: an invented demo home (see shared.ts). */
import type { HomeFileInput } from '../../../core/schema.ts';
import {
  ALDER_CREEK_CLIMATE,
  DEMO_TOWNS,
  ECONOMICS,
  PRICES,
  crewCost,
  demoAddress,
  demoNotes,
  range,
} from './shared.ts';

export const KESTREL_PARK_LANE: HomeFileInput = {
  format: 'sealwork-home/1',
  name: '14 Kestrel Park Lane: 1979 single-wide manufactured home, propane, work done',
  demo: true,
  address: demoAddress('14 Kestrel Park Lane', DEMO_TOWNS.stonecrop),
  client: { name: 'Loretta Vickers', phone: '555-0105' },
  notes: demoNotes(
    'Single-wide on piers with vinyl skirting; ducts run in the belly and the belly board was torn at the plumbing and below the furnace. Counterflow furnace and water heater are both sealed combustion, in closets opening outdoors. Work finished; test-out done.',
  ),
  house: {
    conditionedFloorAreaFt2: 980,
    conditionedVolumeFt3: 7_350,
    stories: 1,
    heightFt: 11,
    bedrooms: 2,
    shelterClass: 3,
    foundation: 'crawlspace',
    yearBuilt: 1979,
  },
  climate: ALDER_CREEK_CLIMATE,
  heating: {
    fuel: 'propane',
    equipment: 'furnace',
    efficiency: 0.78,
    distributionEfficiency: 0.72,
    combustionVenting: 'sealed',
  },
  cooling: null,
  prices: PRICES,
  economics: ECONOMICS,
  infiltrationMethod: 'nFactor',
  leakageTest: { cfm50: 2150, testedOn: '2026-01-27' },
  otherLeakageTests: [
    {
      kind: 'testOut',
      points: [
        { pa: 15, cfm: 760 },
        { pa: 22, cfm: 950 },
        { pa: 29, cfm: 1150 },
        { pa: 36, cfm: 1300 },
        { pa: 43, cfm: 1490 },
      ],
      testedOn: '2026-02-19',
    },
  ],
  combustionAppliances: [{ kind: 'waterHeater', fuel: 'propane', venting: 'sealed' }],
  measures: [
    {
      id: 'kestrel-belly',
      type: 'plumbing-penetrations',
      reductionCfm50: range(150, 250, 350),
      cost: crewCost(120, 5),
      status: 'done',
      note: 'Belly board patched and taped at the plumbing drops and under the furnace.',
    },
    {
      id: 'kestrel-boots',
      type: 'duct-boots',
      location: 'floor',
      byUnits: { units: 9 },
      cost: crewCost(45, 2.5),
      status: 'done',
      note: 'Floor registers sealed to the belly trunk.',
    },
    {
      id: 'kestrel-doors',
      type: 'door-weatherstrip',
      byUnits: { units: 2 },
      cost: crewCost(70, 2),
      status: 'done',
    },
    {
      id: 'kestrel-range-hood',
      type: 'range-hood-damper',
      byUnits: { units: 1 },
      cost: crewCost(30, 1),
      status: 'done',
    },
    {
      id: 'kestrel-windows',
      type: 'window-sealing',
      byUnits: { units: 10 },
      cost: crewCost(80, 5),
    },
  ],
};
