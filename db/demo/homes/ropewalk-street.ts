/** 31 Ropewalk Street, Alder Creek: an invented demo home (see shared.ts). */
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

export const ROPEWALK_STREET: HomeFileInput = {
  format: 'sealwork-home/1',
  name: '31 Ropewalk Street: 1894 brick townhouse, three storeys, gas steam boiler',
  demo: true,
  address: demoAddress('31 Ropewalk Street', DEMO_TOWNS.alderCreek),
  client: { name: 'Hollis and Mercy Adeyemi', phone: '555-0131' },
  notes: demoNotes(
    'Brick end-of-row townhouse by the old mill race, three storeys over a cellar. Three parlour fireplaces with no working dampers, two abandoned flues open into the attic, tall double-hung windows. One-pipe steam from a natural-draft gas boiler. An earlier test by the previous owner’s contractor is kept for comparison.',
  ),
  house: {
    conditionedFloorAreaFt2: 2800,
    conditionedVolumeFt3: 28_000,
    stories: 3,
    heightFt: 32,
    bedrooms: 4,
    shelterClass: 5,
    foundation: 'basement',
    yearBuilt: 1894,
  },
  climate: ALDER_CREEK_CLIMATE,
  heating: {
    fuel: 'naturalGas',
    equipment: 'boiler',
    efficiency: 0.76,
    distributionEfficiency: 0.8,
    combustionVenting: 'naturalDraft',
  },
  cooling: null,
  prices: PRICES,
  economics: ECONOMICS,
  infiltrationMethod: 'ashrae622',
  leakageTest: {
    points: [
      { pa: 15, cfm: 2770 },
      { pa: 20, cfm: 3315 },
      { pa: 25, cfm: 3710 },
      { pa: 30, cfm: 4215 },
      { pa: 35, cfm: 4515 },
      { pa: 40, cfm: 4945 },
      { pa: 45, cfm: 5190 },
      { pa: 50, cfm: 5650 },
    ],
    testedOn: '2026-10-06',
  },
  otherLeakageTests: [
    {
      kind: 'testIn',
      cfm50: 5920,
      testedOn: '2025-11-18',
      note: 'Earlier one-point test by another contractor, before two broken sashes were reglazed.',
    },
  ],
  combustionAppliances: [
    { kind: 'waterHeater', fuel: 'naturalGas', venting: 'naturalDraft' },
    { kind: 'range', fuel: 'naturalGas', venting: 'none' },
  ],
  measures: [
    {
      id: 'ropewalk-dead-flues',
      type: 'flue-chase',
      reductionCfm50: range(150, 250, 380),
      cost: crewCost(90, 3),
      note: 'Two abandoned flues capped at the attic floor with sheet metal and high-temperature sealant.',
    },
    {
      id: 'ropewalk-fireplaces',
      type: 'fireplace-damper',
      byUnits: { units: 3, leakageAreaIn2PerUnit: range(8, 15, 30) },
      cost: crewCost(540, 4),
      note: 'Top-sealing dampers on the three parlour chimneys; the old throat dampers are rusted part-open, so each leaks less than an open flue.',
    },
    {
      id: 'ropewalk-hatch',
      type: 'attic-hatch',
      reductionCfm50: range(40, 70, 100),
      cost: crewCost(50, 1.5),
    },
    {
      id: 'ropewalk-joist-pockets',
      type: 'band-joist',
      byUnits: { units: 180, leakageAreaIn2PerUnit: range(0.1, 0.2, 0.5) },
      cost: crewCost(160, 9),
      note: 'Floor joists pocketed into the brick at each storey, sealed from inside where the ceilings are open.',
    },
    {
      id: 'ropewalk-rim',
      type: 'rim-joist',
      shareOfLocation: { share: range(0.15, 0.25, 0.35) },
      cost: crewCost(150, 5),
    },
    {
      id: 'ropewalk-windows',
      type: 'window-sealing',
      byUnits: { units: 22 },
      cost: crewCost(170, 13),
    },
  ],
};
