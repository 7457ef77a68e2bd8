/** 204 Wicket Street, Alder Creek: an invented demo home (see shared.ts). */
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

export const WICKET_STREET: HomeFileInput = {
  format: 'sealwork-home/1',
  name: '204 Wicket Street: 1947 bungalow, knob-and-tube and vermiculite, oil furnace',
  demo: true,
  address: demoAddress('204 Wicket Street', DEMO_TOWNS.alderCreek),
  client: { name: 'Abdirahman Yusuf', phone: '555-0194' },
  notes: demoNotes(
    'Storey-and-a-half bungalow. Knob-and-tube circuits still live in the attic; the attic floor is covered in loose fill that looks like vermiculite. Attic work waits for an asbestos test and an electrician; this year the crew works in the basement and at doors and windows only.',
  ),
  house: {
    conditionedFloorAreaFt2: 1300,
    conditionedVolumeFt3: 10_400,
    stories: 1.5,
    heightFt: 16,
    bedrooms: 2,
    shelterClass: 4,
    foundation: 'basement',
    yearBuilt: 1947,
    knobAndTubeWiring: true,
    vermiculiteSuspected: true,
  },
  climate: ALDER_CREEK_CLIMATE,
  heating: {
    fuel: 'heatingOil',
    equipment: 'furnace',
    efficiency: 0.8,
    distributionEfficiency: 0.85,
    combustionVenting: 'naturalDraft',
  },
  cooling: null,
  prices: PRICES,
  economics: ECONOMICS,
  infiltrationMethod: 'ashrae622',
  leakageTest: { cfm50: 3450, exponentN: 0.63, testedOn: '2026-05-06' },
  measures: [
    {
      id: 'wicket-top-plates',
      type: 'attic-top-plates',
      byUnits: { units: 150 },
      cost: crewCost(110, 7),
      status: 'declined',
      note: 'Deferred: the attic fill must be tested for asbestos and the wiring made safe before anyone works there.',
    },
    {
      id: 'wicket-rim',
      type: 'rim-joist',
      shareOfLocation: { share: range(0.25, 0.35, 0.5) },
      cost: crewCost(170, 5),
    },
    {
      id: 'wicket-sill',
      type: 'sill-plate',
      byUnits: { units: 130 },
      cost: crewCost(50, 3),
    },
    {
      id: 'wicket-doors',
      type: 'door-weatherstrip',
      byUnits: { units: 2 },
      cost: crewCost(70, 2),
    },
    {
      id: 'wicket-plumbing',
      type: 'plumbing-penetrations',
      byUnits: { units: 8 },
      cost: crewCost(30, 1.5),
    },
    {
      id: 'wicket-windows',
      type: 'window-sealing',
      byUnits: { units: 14 },
      cost: crewCost(110, 8),
    },
  ],
};
