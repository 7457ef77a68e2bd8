/**
 * What saved energy is worth: the home's prices in Decimal, and the present-value factor of a
 * year's savings of each fuel over a life, cached because every candidate measure of every
 * step asks for the same few.
 */
import { escalatedUniformPresentValueFactor } from '../economics/index.ts';
import type { AnnualEnergy } from '../energy.ts';
import { InputError } from '../errors.ts';
import { Decimal, roundToCents } from '../money.ts';
import type { HomeFile } from '../schema.ts';

interface FuelPrice {
  usdPerUnit: Decimal;
  /** The same price as float64, for ranking candidates quickly. */
  usdPerUnitFloat: number;
  escalationRateReal: number;
}

/** The worth of one year's energy savings, split by what is bought. */
export interface AnnualWorth {
  heatingUsd: Decimal;
  /** Electricity other than heating: cooling and ventilation fans. */
  electricityUsd: Decimal;
  /** heatingUsd + electricityUsd rounded to the cent. */
  totalUsd: Decimal;
}

export interface PriceBook {
  readonly discountRateReal: number;
  readonly heating: FuelPrice;
  /** Null when the home buys no electricity the plan affects. */
  readonly electricity: FuelPrice | null;
  /** A year's worth of saved energy (negative for energy added). */
  annualWorth(
    saved: Pick<AnnualEnergy, 'heatingFuelUnits' | 'coolingKwh' | 'ventilationFanKwh'>,
  ): AnnualWorth;
  /** Present value of `worth` each year for `lifeYears`, escalated by fuel, to the cent. */
  presentValue(worth: AnnualWorth, lifeYears: number): Decimal;
  /** The same in float64, for ranking candidates quickly. */
  presentValueFloat(heatingUsd: number, electricityUsd: number, lifeYears: number): number;
  /** Electricity price, or an error naming the field when the home file has none. */
  requireElectricity(reason: string): FuelPrice;
}

/**
 * UPV* factors by (discount rate, escalation, life), shared by every home: a pure function of
 * its key, so remembering it changes no result. Bounded, since keys come from user input.
 */
const FACTOR_CACHE = new Map<string, { exact: Decimal; float: number }>();
const FACTOR_CACHE_LIMIT = 4096;

function presentValueFactor(
  discountRateReal: number,
  escalationRateReal: number,
  lifeYears: number,
) {
  const key = `${discountRateReal}|${escalationRateReal}|${lifeYears}`;
  let cached = FACTOR_CACHE.get(key);
  if (!cached) {
    const exact = escalatedUniformPresentValueFactor({
      discountRateReal,
      escalationRateReal,
      years: lifeYears,
    });
    cached = { exact, float: exact.toNumber() };
    if (FACTOR_CACHE.size >= FACTOR_CACHE_LIMIT) FACTOR_CACHE.clear();
    FACTOR_CACHE.set(key, cached);
  }
  return cached;
}

/** The price book of a parsed home. */
export function buildPriceBook(home: HomeFile): PriceBook {
  const discountRateReal = home.economics.discountRateReal;
  const read = (fuel: keyof HomeFile['prices']): FuelPrice | null => {
    const price = home.prices[fuel];
    if (!price) return null;
    return {
      usdPerUnit: new Decimal(price.usdPerUnit),
      usdPerUnitFloat: price.usdPerUnit,
      escalationRateReal: price.escalationRateReal ?? 0,
    };
  };
  const heating = read(home.heating.fuel);
  if (!heating) {
    throw InputError.at(
      `prices.${home.heating.fuel}`,
      'is required: expected the heating fuel price',
    );
  }
  const electricity = read('electricity');

  const factor = (escalationRateReal: number, lifeYears: number) =>
    presentValueFactor(discountRateReal, escalationRateReal, lifeYears);
  const electricityEscalation = electricity?.escalationRateReal ?? 0;

  return {
    discountRateReal,
    heating,
    electricity,
    annualWorth(saved) {
      const heatingUsd = heating.usdPerUnit.times(saved.heatingFuelUnits);
      const electricKwh = saved.coolingKwh + saved.ventilationFanKwh;
      const electricityUsd =
        electricKwh === 0
          ? new Decimal(0)
          : (
              electricity ?? this.requireElectricity('cooling and ventilation fans')
            ).usdPerUnit.times(electricKwh);
      return {
        heatingUsd,
        electricityUsd,
        totalUsd: roundToCents(heatingUsd.plus(electricityUsd)),
      };
    },
    presentValue(worth, lifeYears) {
      const heatingPv = worth.heatingUsd.times(factor(heating.escalationRateReal, lifeYears).exact);
      const electricityPv = worth.electricityUsd.isZero()
        ? new Decimal(0)
        : worth.electricityUsd.times(factor(electricityEscalation, lifeYears).exact);
      return roundToCents(heatingPv.plus(electricityPv));
    },
    presentValueFloat(heatingUsd, electricityUsd, lifeYears) {
      return (
        heatingUsd * factor(heating.escalationRateReal, lifeYears).float +
        (electricityUsd === 0 ? 0 : electricityUsd * factor(electricityEscalation, lifeYears).float)
      );
    },
    requireElectricity(reason) {
      if (!electricity) {
        throw InputError.at(
          'prices.electricity',
          `is required for ${reason}: expected { usdPerUnit } per kWh`,
        );
      }
      return electricity;
    },
  };
}
