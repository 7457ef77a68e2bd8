import { describe, expect, it } from 'vitest';
import { InputError } from '../../core/errors.ts';
import {
  assessSafety,
  CAUTION_CODES,
  type Caution,
  type CautionCode,
  type SafetyInput,
} from '../../core/safety.ts';
import type { CombustionAppliance } from '../../core/schema.ts';

/**
 * A house that raises no caution: built 1990, all electric, no appliances that burn fuel, one
 * door being weatherstripped, a fan big enough, the infiltration credit taken, and an ACH50
 * after the plan of 2500·60/16000 = 9.4.
 */
function baseInput(): SafetyInput {
  return {
    house: { yearBuilt: 1990 },
    heating: { fuel: 'electricity', equipment: 'heatPump' },
    combustionAppliances: [],
    plannedMeasures: [{ id: 'm-door', type: 'door-weatherstrip', location: 'wall' }],
    leakage: { cfm50Before: 3000, cfm50After: 2500, volumeFt3: 16_000 },
    ventilation: {
      requiredCfm: 90,
      fanNeedBeforeCfm: 0,
      fanNeedAfterCfm: 20,
      existingFanCfm: 50,
      fanAdded: false,
      infiltrationCreditTaken: true,
    },
  };
}

function withInput(change: (input: SafetyInput) => void): SafetyInput {
  const input = baseInput();
  change(input);
  return input;
}

function find(cautions: readonly Caution[], code: CautionCode): Caution | undefined {
  return cautions.find((caution) => caution.code === code);
}

function codes(cautions: readonly Caution[]): CautionCode[] {
  return cautions.map((caution) => caution.code);
}

const waterHeater = (change: Partial<CombustionAppliance> = {}): CombustionAppliance => ({
  kind: 'waterHeater',
  fuel: 'naturalGas',
  venting: 'naturalDraft',
  ...change,
});

const COMBUSTION_CODES: CautionCode[] = [
  'combustion-safety-test',
  'natural-draft-appliance',
  'unknown-venting',
  'unvented-combustion',
  'co-alarm',
];

describe('assessSafety: baseline', () => {
  it('raises nothing for a house with no hazard', () => {
    expect(assessSafety(baseInput())).toEqual([]);
  });
});

describe('combustion safety test-out (common practice: worst-case CAZ test)', () => {
  it('is a danger with a natural-draft water heater inside a house being tightened', () => {
    const cautions = assessSafety(withInput((i) => (i.combustionAppliances = [waterHeater()])));
    const test = find(cautions, 'combustion-safety-test');
    expect(test?.severity).toBe('danger');
    expect(test?.measureIds).toEqual(['m-door']);
    expect(test?.message).toMatch(/depressurization/);
    expect(test?.message).toMatch(/spillage/);
    expect(test?.message).toMatch(/CO/);
    expect(find(cautions, 'natural-draft-appliance')?.severity).toBe('warning');
    expect(find(cautions, 'co-alarm')?.severity).toBe('notice');
  });

  it('raises no combustion caution in an all-electric house', () => {
    const input = withInput((i) => {
      i.combustionAppliances = [{ kind: 'dryer', fuel: 'electricity', venting: 'none' }];
    });
    const found = codes(assessSafety(input));
    for (const code of COMBUSTION_CODES) expect(found).not.toContain(code);
  });

  it('is a warning for an induced-draft furnace and a notice when all is sealed combustion', () => {
    const induced = withInput((i) => {
      i.heating = { fuel: 'naturalGas', equipment: 'furnace', combustionVenting: 'inducedDraft' };
    });
    expect(find(assessSafety(induced), 'combustion-safety-test')?.severity).toBe('warning');
    const sealed = withInput((i) => {
      i.heating = { fuel: 'propane', equipment: 'boiler', combustionVenting: 'sealed' };
      i.combustionAppliances = [waterHeater({ venting: 'sealed', fuel: 'propane' })];
    });
    const test = find(assessSafety(sealed), 'combustion-safety-test');
    expect(test?.severity).toBe('notice');
    expect(test?.message).toMatch(/CO/);
    expect(find(assessSafety(sealed), 'natural-draft-appliance')).toBeUndefined();
  });

  it('is not needed when the appliance is outside the pressure boundary', () => {
    const input = withInput((i) => {
      i.combustionAppliances = [waterHeater({ insidePressureBoundary: false })];
    });
    const found = codes(assessSafety(input));
    expect(found).not.toContain('combustion-safety-test');
    expect(found).not.toContain('natural-draft-appliance');
    expect(found).toContain('co-alarm');
  });

  it('is not raised when the plan does not lower CFM50', () => {
    const input = withInput((i) => {
      i.combustionAppliances = [waterHeater()];
      i.leakage.cfm50After = i.leakage.cfm50Before;
    });
    expect(find(assessSafety(input), 'combustion-safety-test')).toBeUndefined();
  });

  it('asks for the venting of a fuel-burning heater when it is not given, and assumes the worst', () => {
    const input = withInput((i) => {
      i.heating = { fuel: 'naturalGas', equipment: 'furnace' };
    });
    const cautions = assessSafety(input);
    expect(find(cautions, 'unknown-venting')?.severity).toBe('warning');
    expect(find(cautions, 'unknown-venting')?.message).toMatch(/natural draft/);
    expect(find(cautions, 'combustion-safety-test')?.severity).toBe('danger');
    const known = withInput((i) => {
      i.heating = { fuel: 'naturalGas', equipment: 'furnace', combustionVenting: 'sealed' };
    });
    expect(find(assessSafety(known), 'unknown-venting')).toBeUndefined();
  });

  it('grades unvented appliances: range notice, space heater warning, water heater danger', () => {
    const severityWith = (appliance: CombustionAppliance) =>
      find(
        assessSafety(withInput((i) => (i.combustionAppliances = [appliance]))),
        'unvented-combustion',
      )?.severity;
    expect(severityWith({ kind: 'range', fuel: 'naturalGas', venting: 'none' })).toBe('notice');
    expect(severityWith({ kind: 'spaceHeater', fuel: 'kerosene', venting: 'none' })).toBe(
      'warning',
    );
    expect(severityWith(waterHeater({ venting: 'none' }))).toBe('danger');
    expect(severityWith(waterHeater())).toBeUndefined();
  });
});

describe('ventilation (ANSI/ASHRAE Standard 62.2, sections 4.1 and 4.1.2)', () => {
  // 62.2 4.1: Q_tot = 0.03·A_floor + 7.5·(N_br + 1); 2000 ft², 3 bedrooms → 90 cfm.
  const requiredCfm = 0.03 * 2000 + 7.5 * (3 + 1);

  it('warns when the fan needed after the plan exceeds the existing fan, naming both', () => {
    const input = withInput((i) => {
      i.ventilation = { ...i.ventilation, requiredCfm, fanNeedAfterCfm: 60, existingFanCfm: 0 };
    });
    const caution = find(assessSafety(input), 'ventilation-needed');
    expect(caution?.severity).toBe('warning');
    expect(caution?.message).toContain('90 cfm');
    expect(caution?.message).toContain('60 cfm');
    expect(caution?.message).toContain('62.2');
    expect(caution?.measureIds).toEqual(['m-door']);
  });

  it('stays quiet when the existing fan covers the need', () => {
    const input = withInput((i) => {
      i.ventilation = { ...i.ventilation, fanNeedAfterCfm: 50, existingFanCfm: 50 };
    });
    expect(find(assessSafety(input), 'ventilation-needed')).toBeUndefined();
  });

  it('is only a notice when the plan adds the fan', () => {
    const input = withInput((i) => {
      i.ventilation = { ...i.ventilation, fanNeedAfterCfm: 60, existingFanCfm: 0, fanAdded: true };
    });
    expect(find(assessSafety(input), 'ventilation-needed')?.severity).toBe('notice');
  });

  it('is a danger below 3 ACH50 with an appliance using house air, a warning at 3 ACH50', () => {
    // ACH50 = CFM50·60/V: 720·60/16000 = 2.7; 800·60/16000 = 3.0.
    const tight = (cfm50After: number, appliance: CombustionAppliance) =>
      withInput((i) => {
        i.leakage.cfm50After = cfm50After;
        i.combustionAppliances = [appliance];
        i.ventilation = { ...i.ventilation, fanNeedAfterCfm: 60, existingFanCfm: 0 };
      });
    const severity = (input: SafetyInput) =>
      find(assessSafety(input), 'ventilation-needed')?.severity;
    expect(severity(tight(720, waterHeater()))).toBe('danger');
    expect(severity(tight(800, waterHeater()))).toBe('warning');
    expect(severity(tight(720, waterHeater({ venting: 'sealed' })))).toBe('warning');
  });

  it('flags a house short of ventilation before any sealing', () => {
    const short = withInput((i) => {
      i.ventilation = { ...i.ventilation, fanNeedBeforeCfm: 40, existingFanCfm: 30 };
    });
    expect(find(assessSafety(short), 'ventilation-before-sealing')?.severity).toBe('warning');
    const fine = withInput((i) => {
      i.ventilation = { ...i.ventilation, fanNeedBeforeCfm: 30, existingFanCfm: 30 };
    });
    expect(find(assessSafety(fine), 'ventilation-before-sealing')).toBeUndefined();
  });

  it('notes a fan sized without an infiltration credit (no weather and shielding factor)', () => {
    const input = withInput((i) => (i.ventilation.infiltrationCreditTaken = false));
    const caution = find(assessSafety(input), 'no-infiltration-credit');
    expect(caution?.severity).toBe('notice');
    expect(caution?.message).toMatch(/weather and shielding factor/);
  });

  it('notes a plan that leaves the house below 5 ACH50 (IRC 2012 R303.4, from memory)', () => {
    // 1300·60/16000 = 4.875 ACH50; 1350·60/16000 = 5.06.
    const below = withInput((i) => (i.leakage.cfm50After = 1300));
    expect(find(assessSafety(below), 'very-tight')?.severity).toBe('notice');
    const above = withInput((i) => (i.leakage.cfm50After = 1350));
    expect(find(assessSafety(above), 'very-tight')).toBeUndefined();
  });
});

describe('hazards of the work', () => {
  const plan = (...types: string[]) =>
    types.map((type, index) => ({ id: `m${index + 1}`, type, location: 'ceiling' as const }));

  it('asks for noncombustible materials and clearance at a flue chase', () => {
    const input = withInput((i) => (i.plannedMeasures = plan('flue-chase')));
    const caution = find(assessSafety(input), 'flue-clearance');
    expect(caution?.severity).toBe('danger');
    expect(caution?.message).toMatch(/sheet metal/);
    expect(caution?.message).toMatch(/never put foam/);
  });

  it('asks for IC-AT rated covers or fixtures at recessed lights', () => {
    const input = withInput((i) => (i.plannedMeasures = plan('recessed-lights')));
    expect(find(assessSafety(input), 'recessed-light-rating')?.message).toMatch(/IC and AT/);
  });

  it('raises knob-and-tube wiring for attic work, not for a door alone', () => {
    const attic = withInput((i) => {
      i.house.knobAndTubeWiring = true;
      i.plannedMeasures = plan('attic-top-plates', 'door-weatherstrip', 'attic-chases');
    });
    const caution = find(assessSafety(attic), 'knob-and-tube-wiring');
    expect(caution?.severity).toBe('danger');
    expect(caution?.measureIds).toEqual(['m1', 'm3']);
    expect(caution?.message).toMatch(/licensed electrician/);
    const doorOnly = withInput((i) => (i.house.knobAndTubeWiring = true));
    expect(find(assessSafety(doorOnly), 'knob-and-tube-wiring')).toBeUndefined();
    const noWiring = withInput((i) => (i.plannedMeasures = plan('attic-top-plates')));
    expect(find(assessSafety(noWiring), 'knob-and-tube-wiring')).toBeUndefined();
  });

  it('treats suspected vermiculite as possible asbestos (US EPA and ATSDR, 2003 best practices)', () => {
    const suspected = withInput((i) => {
      i.house.vermiculiteSuspected = true;
      i.plannedMeasures = plan('attic-hatch');
    });
    const caution = find(assessSafety(suspected), 'vermiculite');
    expect(caution?.severity).toBe('danger');
    expect(caution?.message).toMatch(/asbestos/);
    expect(caution?.message).toMatch(/do not disturb/);
    expect(caution?.message).toMatch(/accredited laboratory/);
    const notSuspected = withInput((i) => (i.plannedMeasures = plan('attic-hatch')));
    expect(find(assessSafety(notSuspected), 'vermiculite')).toBeUndefined();
  });

  it('asks for lead-safe work in a house built in 1977, not in 1978 (EPA RRP, 40 CFR 745)', () => {
    // 40 CFR 745.103: target housing is housing constructed prior to 1978.
    const built = (yearBuilt: number) =>
      find(assessSafety(withInput((i) => (i.house.yearBuilt = yearBuilt))), 'lead-safe-work');
    expect(built(1977)?.measureIds).toEqual(['m-door']);
    expect(built(1977)?.message).toMatch(/40 CFR 745/);
    expect(built(1978)).toBeUndefined();
  });

  it('covers spray foam, dryer vents, fan ducts, fireplaces and garage walls', () => {
    const input = withInput((i) => {
      i.plannedMeasures = plan(
        'rim-joist',
        'dryer-vent',
        'exhaust-fan-vents',
        'fireplace-damper',
        'garage-house-wall',
      );
    });
    const cautions = assessSafety(input);
    expect(find(cautions, 'spray-foam-handling')?.message).toMatch(/re-occupancy/);
    expect(find(cautions, 'spray-foam-handling')?.measureIds).toEqual(['m1', 'm5']);
    expect(find(cautions, 'dryer-vent')?.message).toMatch(/metal duct/);
    expect(find(cautions, 'dryer-vent')?.message).toMatch(/never end it in the attic/);
    expect(find(cautions, 'exhaust-termination')?.measureIds).toEqual(['m3']);
    expect(find(cautions, 'fireplace')?.message).toMatch(/chimney/);
    expect(find(cautions, 'attached-garage')?.message).toMatch(/fire separation/);
    expect(find(cautions, 'co-alarm')?.measureIds).toEqual(['m5']);
  });

  it('raises the fireplace caution for a wood fireplace even without a fireplace measure', () => {
    const input = withInput((i) => {
      i.combustionAppliances = [{ kind: 'fireplace', fuel: 'wood', venting: 'naturalDraft' }];
    });
    expect(find(assessSafety(input), 'fireplace')?.measureIds).toEqual([]);
  });
});

describe('assessSafety: result', () => {
  const MEASURE_TYPES = [
    'flue-chase',
    'recessed-lights',
    'attic-top-plates',
    'door-weatherstrip',
    'rim-joist',
    'dryer-vent',
    'exhaust-fan-vents',
    'fireplace-damper',
    'garage-house-wall',
  ];

  const busy = () =>
    withInput((i) => {
      i.house = { yearBuilt: 1925, knobAndTubeWiring: true, vermiculiteSuspected: true };
      // Heating venting left out on purpose, so the unknown-venting rule fires too.
      i.heating = { fuel: 'heatingOil', equipment: 'boiler' };
      i.combustionAppliances = [waterHeater(), { kind: 'range', fuel: 'propane', venting: 'none' }];
      i.plannedMeasures = MEASURE_TYPES.map((type, index) => ({
        id: `m${index}`,
        type,
        location: 'ceiling',
      }));
      i.leakage.cfm50After = 700;
      i.ventilation = {
        requiredCfm: 90,
        fanNeedBeforeCfm: 40,
        fanNeedAfterCfm: 80,
        existingFanCfm: 0,
        fanAdded: false,
        infiltrationCreditTaken: false,
      };
    });

  it('sorts danger → warning → notice, then by code, each code once', () => {
    const cautions = assessSafety(busy());
    const rank = { danger: 0, warning: 1, notice: 2 };
    for (let index = 1; index < cautions.length; index++) {
      const previous = cautions[index - 1];
      const current = cautions[index];
      if (previous === undefined || current === undefined) throw new Error('index out of range');
      const order = rank[previous.severity] - rank[current.severity];
      expect(order).toBeLessThanOrEqual(0);
      if (order === 0) expect(previous.code < current.code).toBe(true);
    }
    expect(new Set(codes(cautions)).size).toBe(cautions.length);
    // The busy house triggers every code the check knows.
    expect([...codes(cautions)].sort()).toEqual([...CAUTION_CODES].sort());
  });

  it('gives the same result every time', () => {
    expect(assessSafety(busy())).toEqual(assessSafety(busy()));
  });

  it('defers to local codes and licensed professionals in every message', () => {
    for (const caution of assessSafety(busy())) {
      expect(caution.message, caution.code).toMatch(/local codes/i);
      expect(caution.message, caution.code).toMatch(/licensed/i);
      expect(caution.message, caution.code).toMatch(/manufacturer/i);
    }
  });

  it('does not change its input', () => {
    const input = busy();
    const before = structuredClone(input);
    assessSafety(input);
    expect(input).toEqual(before);
  });

  it('throws InputError naming the field for impossible input', () => {
    const fieldOf = (input: SafetyInput): string => {
      try {
        assessSafety(input);
      } catch (error) {
        if (error instanceof InputError) return error.field;
        throw error;
      }
      throw new Error('expected an InputError');
    };
    expect(fieldOf(withInput((i) => (i.leakage.volumeFt3 = 0)))).toBe('leakage.volumeFt3');
    expect(fieldOf(withInput((i) => (i.leakage.cfm50After = 3500)))).toBe('leakage.cfm50After');
    expect(fieldOf(withInput((i) => (i.leakage.cfm50Before = Number.NaN)))).toBe(
      'leakage.cfm50Before',
    );
    const unknownType = withInput((i) => {
      i.plannedMeasures = [{ id: 'm1', type: 'attic-magic', location: 'ceiling' }];
    });
    expect(fieldOf(unknownType)).toBe('plannedMeasures[0].type');
    expect(fieldOf(withInput((i) => (i.house.yearBuilt = 1977.5)))).toBe('house.yearBuilt');
  });
});
