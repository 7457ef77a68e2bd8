/** 27 Sorrel Ridge Drive, Petrel Ford: an invented demo home (see shared.ts). */
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

export const SORREL_RIDGE_DRIVE: HomeFileInput = {
  format: 'sealwork-home/1',
  name: '27 Sorrel Ridge Drive: 2006 colonial, heat pump with its air handler in the attic',
  demo: true,
  address: demoAddress('27 Sorrel Ridge Drive', DEMO_TOWNS.petrelFord),
  client: { name: 'Kenji and Rachel Moriyama', email: 'moriyama.home@example.org' },
  notes: demoNotes(
    'Two-storey colonial with an attached two-car garage. The heat pump’s air handler sits on a platform in the attic; its return plenum is open to the attic at the platform and every ceiling boot leaks. Bath fans run on switches only: no continuous ventilation.',
  ),
  house: {
    conditionedFloorAreaFt2: 2600,
    conditionedVolumeFt3: 23_400,
    stories: 2,
    heightFt: 20,
    bedrooms: 4,
    shelterClass: 3,
    foundation: 'basement',
    yearBuilt: 2006,
  },
  climate: ALDER_CREEK_CLIMATE,
  heating: {
    fuel: 'electricity',
    equipment: 'heatPump',
    efficiency: 8.5,
    distributionEfficiency: 0.78,
  },
  cooling: { seer: 14, distributionEfficiency: 0.78 },
  prices: PRICES,
  economics: ECONOMICS,
  infiltrationMethod: 'aim2',
  leakageTest: {
    points: [
      { pa: 15, cfm: 1480 },
      { pa: 23, cfm: 1985 },
      { pa: 31, cfm: 2370 },
      { pa: 39, cfm: 2825 },
      { pa: 47, cfm: 3155 },
      { pa: 55, cfm: 3555 },
    ],
    testedOn: '2026-05-19',
  },
  ventilation: { existingFanCfm: 0, fanType: 'exhaust', fanCostUsd: 480 },
  emissions: EMISSIONS,
  measures: [
    {
      id: 'sorrel-air-handler',
      type: 'attic-chases',
      reductionCfm50: range(150, 260, 380),
      cost: crewCost(120, 4),
      note: 'Return plenum and platform around the attic air handler sealed to the ceiling.',
    },
    {
      id: 'sorrel-boots',
      type: 'duct-boots',
      byUnits: { units: 18 },
      cost: crewCost(60, 4),
    },
    {
      id: 'sorrel-cans',
      type: 'recessed-lights',
      byUnits: { units: 16 },
      cost: crewCost(350, 6),
    },
    {
      id: 'sorrel-stair',
      type: 'attic-pull-down-stair',
      reductionCfm50: range(50, 90, 130),
      cost: crewCost(180, 2),
    },
    {
      id: 'sorrel-garage',
      type: 'garage-house-wall',
      reductionCfm50: range(80, 150, 220),
      cost: crewCost(140, 5),
      note: 'Floor of the bonus room over the garage and the garage ceiling joints.',
    },
    {
      id: 'sorrel-fans',
      type: 'exhaust-fan-vents',
      byUnits: { units: 4 },
      cost: crewCost(80, 2),
    },
  ],
};
