/**
 * The ventilation a tighter house needs. When the package brings the 62.2 fan need above the
 * fans the house already runs, the package carries a fan. Its installed cost is a
 * health-and-safety cost: counted in the package cost, kept out of the SIR. Its running cost
 * (power, and heating and cooling the air it moves) is already in the measures' savings:
 * every step is valued with the ventilation 62.2 asks for at its leakage (`energyOf` in
 * home-model.ts), so the measures that call for the fan carry what it costs to run.
 */
import { totalCfm50, type HomeModel, type LeakageByLocation } from '../home-model.ts';
import { Decimal, roundToCents } from '../money.ts';
import type { PriceBook } from './prices.ts';

/**
 * Installed cost of a continuous exhaust fan when the home file gives none, USD. Demo
 * default, not a market price: set `ventilation.fanCostUsd` for the job.
 */
export const DEFAULT_FAN_COST_USD = 450;

export interface VentilationOutcome {
  requiredCfm: number;
  infiltrationCfmBefore: number;
  infiltrationCfm: number;
  fanCfmBefore: number;
  fanCfm: number;
  existingFanCfm: number;
  infiltrationCreditTaken: boolean;
  /** The fan the package carries, or null when the house needs none beyond what it has. */
  addedFan: AddedFan | null;
}

export interface AddedFan {
  /** Fan flow beyond the existing fans, cfm. */
  cfm: number;
  costUsd: Decimal;
  /** Its electricity after the package, kWh/yr. */
  annualKwh: number;
  /** What running it costs a year after the package (power and conditioning), to the cent. */
  annualCostUsd: Decimal;
}

/**
 * The 62.2 check before and after the package, and the fan the package must carry.
 *
 * Notes: fan need Q_fan = Q_tot − Φ·Q_inf (ANSI/ASHRAE 62.2, 4.1.2).
 */
export function ventilationAfterPackage(options: {
  model: HomeModel;
  prices: PriceBook;
  leakageAfter: LeakageByLocation;
}): VentilationOutcome {
  const { model, prices, leakageAfter } = options;
  const existingFanCfm = model.existingFanCfm;
  const before = model.ventilation(model.testInCfm50);
  const after = model.ventilation(totalCfm50(leakageAfter));
  const outcome: VentilationOutcome = {
    requiredCfm: after.requiredCfm,
    infiltrationCfmBefore: before.infiltrationCfm,
    infiltrationCfm: after.infiltrationCfm,
    fanCfmBefore: before.fanNeedCfm,
    fanCfm: after.fanNeedCfm,
    existingFanCfm,
    infiltrationCreditTaken: after.infiltrationCreditTaken,
    addedFan: null,
  };
  if (after.fanNeedCfm <= existingFanCfm) return outcome;

  prices.requireElectricity('the ventilation fan the tighter house needs');
  const withFan = model.energyOf(leakageAfter);
  const withoutFan = model.energy(model.airflow(leakageAfter));
  const running = prices.annualWorth({
    heatingFuelUnits: withFan.heatingFuelUnits - withoutFan.heatingFuelUnits,
    coolingKwh: withFan.coolingKwh - withoutFan.coolingKwh,
    ventilationFanKwh: withFan.ventilationFanKwh,
  });
  const settings = model.home.ventilation ?? {};
  outcome.addedFan = {
    cfm: after.fanNeedCfm - existingFanCfm,
    costUsd: roundToCents(new Decimal(settings.fanCostUsd ?? DEFAULT_FAN_COST_USD)),
    annualKwh: withFan.ventilationFanKwh,
    annualCostUsd: running.totalUsd,
  };
  return outcome;
}
