/**
 * The demo scenario. Everything here is invented: the Alder Creek Home Repair Program, its
 * county, its streets and homes, the climate called "Alder Creek, demo", the prices, labour
 * rates and material costs. It shows what Sealwork does; no test uses it as an expected value.
 */
import type { HomeFileInput } from '../../core/schema.ts';

export const DEMO_PROGRAM_NAME = 'Alder Creek Home Repair Program (demo)';

/** An invented cold-temperate climate. */
const ALDER_CREEK_CLIMATE = {
  name: 'Alder Creek, demo',
  hdd65F: 6400,
  cdd65F: 650,
  elevationFt: 1150,
  nFactorZone: 2,
  wsf: 0.56,
  heatingSeason: { meanDeltaTF: 36, meanWindSpeedMph: 9.5 },
  coolingSeason: { meanDeltaTF: 8, meanWindSpeedMph: 7, latentGrainHours: 9000 },
} as const;

/** Invented prices of the demo county, with invented real escalation. */
const PRICES = {
  naturalGas: { usdPerUnit: 1.42, escalationRateReal: 0.01 },
  propane: { usdPerUnit: 2.95, escalationRateReal: 0.01 },
  heatingOil: { usdPerUnit: 3.85, escalationRateReal: 0.015 },
  electricity: { usdPerUnit: 0.168, escalationRateReal: 0.005 },
} as const;

const ECONOMICS = { discountRateReal: 0.03, ranking: 'sir' } as const;

/** The program's invented crew rate and markup. */
function crewCost(materialsUsd: number, laborHours: number, healthAndSafety = false) {
  return {
    materialsUsd,
    laborHours,
    laborRateUsdPerHour: 58,
    markupFraction: 0.15,
    ...(healthAndSafety ? { healthAndSafety } : {}),
  };
}

function range(low: number, likely: number, high: number) {
  return { low, likely, high };
}

export const DEMO_HOMES: readonly HomeFileInput[] = [
  {
    format: 'sealwork-home/1',
    name: '14 Millrace Lane: 1924 two-storey, fieldstone basement, oil boiler',
    house: {
      conditionedFloorAreaFt2: 1850,
      conditionedVolumeFt3: 15_800,
      stories: 2,
      heightFt: 19,
      bedrooms: 3,
      shelterClass: 4,
      foundation: 'basement',
      yearBuilt: 1924,
      knobAndTubeWiring: true,
      flueHeightFt: 30,
    },
    climate: ALDER_CREEK_CLIMATE,
    heating: {
      fuel: 'heatingOil',
      equipment: 'boiler',
      efficiency: 0.78,
      distributionEfficiency: 0.9,
      combustionVenting: 'naturalDraft',
    },
    cooling: null,
    prices: PRICES,
    economics: ECONOMICS,
    infiltrationMethod: 'aim2',
    leakShares: { ceiling: 0.35, wall: 0.33, floor: 0.27, flue: 0.05 },
    leakageTest: {
      points: [
        { pa: 15, cfm: 2210 },
        { pa: 22, cfm: 2780 },
        { pa: 30, cfm: 3350 },
        { pa: 38, cfm: 3890 },
        { pa: 45, cfm: 4310 },
        { pa: 52, cfm: 4700 },
      ],
    },
    combustionAppliances: [{ kind: 'waterHeater', fuel: 'heatingOil', venting: 'naturalDraft' }],
    measures: [
      {
        id: 'mill-top-plates',
        type: 'attic-top-plates',
        reductionCfm50: range(350, 550, 750),
        cost: crewCost(140, 8),
        lifeYears: 20,
      },
      {
        id: 'mill-chases',
        type: 'attic-chases',
        reductionCfm50: range(200, 320, 450),
        cost: crewCost(110, 5),
      },
      {
        id: 'mill-flue-chase',
        type: 'flue-chase',
        reductionCfm50: range(90, 160, 240),
        cost: crewCost(85, 3),
      },
      {
        id: 'mill-hatch',
        type: 'attic-hatch',
        reductionCfm50: range(30, 60, 90),
        cost: crewCost(45, 1.5),
      },
      {
        id: 'mill-rim',
        type: 'rim-joist',
        shareOfLocation: { share: range(0.25, 0.4, 0.55) },
        cost: crewCost(260, 7),
      },
      {
        id: 'mill-sill',
        type: 'sill-plate',
        reductionCfm50: range(80, 150, 240),
        cost: crewCost(60, 4),
      },
      {
        id: 'mill-windows',
        type: 'window-sealing',
        byUnits: { units: 16 },
        cost: crewCost(120, 10),
      },
      {
        id: 'mill-plumbing',
        type: 'plumbing-penetrations',
        byUnits: { units: 10 },
        cost: crewCost(35, 2),
      },
    ],
  },
  {
    format: 'sealwork-home/1',
    name: '208 Quarry Road: 1956 ranch, natural-draft gas furnace',
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
    leakageTest: { cfm50: 3100 },
    combustionAppliances: [
      { kind: 'waterHeater', fuel: 'naturalGas', venting: 'naturalDraft' },
      { kind: 'range', fuel: 'naturalGas', venting: 'none' },
    ],
    emissions: { electricityKgCo2PerKwh: 0.42 },
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
  },
  {
    format: 'sealwork-home/1',
    name: '41 Heron Court: 1974 split-level, heat pump, crawlspace',
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
    leakageTest: { cfm50: 2650, exponentN: 0.67 },
    emissions: { electricityKgCo2PerKwh: 0.42 },
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
  },
  {
    format: 'sealwork-home/1',
    name: '9 Fernbank Way: 1996 slab house, propane furnace, attic ducts',
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
    leakageTest: { cfm50: 2300 },
    emissions: { electricityKgCo2PerKwh: 0.42 },
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
  },
  {
    format: 'sealwork-home/1',
    name: '3 Larch Terrace: 2014 tight house, sealed-combustion gas',
    house: {
      conditionedFloorAreaFt2: 2400,
      conditionedVolumeFt3: 21_600,
      stories: 2,
      heightFt: 19,
      bedrooms: 4,
      shelterClass: 4,
      foundation: 'basement',
      yearBuilt: 2014,
    },
    climate: ALDER_CREEK_CLIMATE,
    heating: {
      fuel: 'naturalGas',
      equipment: 'furnace',
      efficiency: 0.95,
      distributionEfficiency: 0.95,
      combustionVenting: 'sealed',
    },
    cooling: { seer: 16, distributionEfficiency: 0.95 },
    prices: PRICES,
    economics: ECONOMICS,
    infiltrationMethod: 'aim2',
    leakageTest: { cfm50: 1150 },
    ventilation: { existingFanCfm: 0, fanType: 'exhaust', fanCostUsd: 520 },
    emissions: { electricityKgCo2PerKwh: 0.42 },
    measures: [
      {
        id: 'larch-hatch',
        type: 'attic-hatch',
        reductionCfm50: range(40, 70, 100),
        cost: crewCost(60, 1.5),
      },
      {
        id: 'larch-rim',
        type: 'rim-joist',
        reductionCfm50: range(60, 110, 160),
        cost: crewCost(220, 5),
      },
      {
        id: 'larch-penetrations',
        type: 'plumbing-penetrations',
        byUnits: { units: 6 },
        cost: crewCost(20, 1),
      },
    ],
  },
  {
    format: 'sealwork-home/1',
    name: '77 Old Mill Road: 1938 bungalow with kneewalls, gas boiler',
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
    leakageTest: { cfm50: 3900 },
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
  },
];
