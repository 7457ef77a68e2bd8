/** 41 Heron Court, Petrel Ford: an invented demo home (see shared.ts). */
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

export const HERON_COURT: HomeFileInput = {
  format: 'sealwork-home/1',
  name: '41 Heron Court: 1974 split-level, heat pump, crawlspace',
  demo: true,
  address: demoAddress('41 Heron Court', DEMO_TOWNS.petrelFord),
  client: { name: 'Priya Venkataraman and Owen Hale', email: 'pv.hale@example.org' },
  notes: demoNotes(
    'Split-level over a vented crawlspace; the upper level has kneewall attics on both sides and a dropped soffit over the kitchen. All-electric, no fuel burned in the house.',
  ),
  house: {
    conditionedFloorAreaFt2: 1680,
    conditionedVolumeFt3: 13_400,
    stories: 1.5,
    heightFt: 15,
    bedrooms: 4,
    shelterClass: 3,
    foundation: 'crawlspace',
    yearBuilt: 1974,
  },
  climate: ALDER_CREEK_CLIMATE,
  heating: {
    fuel: 'electricity',
    equipment: 'heatPump',
    efficiency: 7.7,
    distributionEfficiency: 0.8,
  },
  cooling: { seer: 13, distributionEfficiency: 0.8 },
  prices: PRICES,
  economics: ECONOMICS,
  infiltrationMethod: 'lblBasic',
  leakageTest: { cfm50: 2650, exponentN: 0.67, testedOn: '2026-03-04' },
  emissions: EMISSIONS,
  measures: [
    {
      id: 'heron-kneewall',
      type: 'kneewalls',
      reductionCfm50: range(150, 260, 380),
      cost: crewCost(180, 6),
    },
    {
      id: 'heron-soffit',
      type: 'dropped-soffit',
      reductionCfm50: range(120, 200, 300),
      cost: crewCost(130, 5),
    },
    {
      id: 'heron-wiring',
      type: 'wiring-penetrations',
      byUnits: { units: 14 },
      cost: crewCost(25, 2),
    },
    {
      id: 'heron-band',
      type: 'band-joist',
      reductionCfm50: range(80, 140, 210),
      cost: crewCost(150, 4),
    },
    {
      id: 'heron-stair',
      type: 'attic-pull-down-stair',
      reductionCfm50: range(50, 90, 130),
      cost: crewCost(160, 2),
    },
  ],
};
