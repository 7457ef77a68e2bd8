/**
 * Natural infiltration hour by hour over a weather year, by the method the home file chose,
 * as degree-hour-weighted means the seasonal energy formulas can take.
 *
 * The seasonal methods (seasonal-airflow.ts) drive each season with one mean ΔT and one mean
 * wind. Flow is not linear in either (the square root of LBL, the power n of AIM-2), and the
 * cold hours that cost most are also the hours of the strongest stack, so one mean misstates
 * the load. Here every hour gets its own ΔT, wind and outdoor air density, and each hour's
 * flow is weighted by what that hour costs:
 *
 * - heatingCfm = Σ_h Q_h·(T_bal − T_h)⁺ / Σ_h (T_bal − T_h)⁺,
 * - coolingCfm = Σ_h Q_h·(T_h − T_bal,c)⁺ / Σ_h (T_h − T_bal,c)⁺,
 * - coolingLatentCfm = Σ_c Q_c·(W_c − W_in)⁺ / Σ_c (W_c − W_in)⁺ over the cooling hours c
 *   (0 when no hour is more humid than indoors).
 *
 * So 1.08·heatingCfm·24·HDD = Σ_h 1.08·Q_h·(T_bal − T_h)⁺ exactly, with HDD, CDD and the
 * latent grain-hours of `hourlySeasons` on the same basis, and seasonalSensibleLoadBtu /
 * seasonalLatentLoadBtu (energy.ts) give the hour-by-hour loads unchanged.
 *
 * Notes: the balance-point convention. An hour's flow is driven by the indoor–outdoor
 * difference (indoor − T while heating, T − indoor while cooling; the sign is ignored, as
 * both models do for the stack), but it is charged only the part of its loss beyond the
 * balance point: internal and solar gains cover the part between the indoor temperature and
 * the balance point. That is what degree days at a 65 °F base already assume; weighting by
 * the same degree-hours keeps the hourly loads comparable with the seasonal ones.
 *
 * The outdoor air density of each hour (AIM-2) is that of dry air at the hour's dry-bulb
 * and the standard-atmosphere pressure of the year's elevation, as seasonal-airflow.ts takes
 * it at the climate's elevation. The N-factor and 62.2 flows do not depend on the weather
 * and are the seasonal ones.
 *
 * References: ASHRAE Handbook—Fundamentals, ventilation and infiltration chapter (basic and
 * enhanced models); Walker & Wilson 1998, HVAC&R Research 4(2), LBNL-42361 (AIM-2); ASHRAE
 * HoF, "Energy Estimating and Modeling Methods" (degree days, balance point; from memory).
 */
import type { LeakageByLocation } from '../home-model.ts';
import { effectiveAnnualInfiltrationCfm } from '../infiltration/ashrae-622.ts';
import { lblStackCoefficientIp, lblWindCoefficientIp } from '../infiltration/lbl-basic.ts';
import { nFactorInfiltration } from '../infiltration/n-factor.ts';
import { elaIn2 } from '../leakage.ts';
import type { HomeFile } from '../schema.ts';
import { aim2Hourly, aim2SeasonPressures, type Aim2SeasonPressures } from './aim2-hourly.ts';
import { totalCfm50Of, weightedMean, type HourlyAirflowCfm } from './hourly-flows.ts';
import { seasonHoursOf, type SeasonHours } from './season-hours.ts';
import {
  checkHourlyBasis,
  checkWeatherYear,
  type HourlyBasis,
  type WeatherYear,
} from './weather-year.ts';

export type { HourlyBasis, HourlySeasons, WeatherYear } from './weather-year.ts';
export {
  checkHourlyBasis,
  checkWeatherYear,
  DEFAULT_HOURLY_BASIS,
  hourlySeasons,
  indoorHumidityRatio,
  INDOOR_COOLING_RELATIVE_HUMIDITY_PCT,
  weatherYearOf,
} from './weather-year.ts';
import { nFactorOfHome, requireMethodInput } from '../seasonal-airflow.ts';

export type { HourlyAirflowCfm } from './hourly-flows.ts';

/**
 * The chosen infiltration method, hour by hour over a weather year, as a function of the
 * leakage state.
 *
 * @param home - the parsed home file (method, house; the climate only for nFactorZone or
 *   wsf where the method needs them: its seasons and degree days are not used)
 * @param exponentN - the house's flow exponent from its test
 * @param year - the hourly weather (its elevation sets the air's density)
 * @param basis - balance points, indoor temperatures and humidity (DEFAULT_HOURLY_BASIS)
 * @returns leakage by location (CFM50) → degree-hour-weighted heating, cooling and latent
 *   flows, cfm (cooling 0 without cooling equipment)
 * @throws InputError naming the field of a malformed year or basis, or a climate field the
 *   method needs; the returned function throws naming `leakage.<location>` for a negative
 *   or non-finite CFM50
 *
 * Notes: per hour, LBL basic Q_h = ELA·√(Cs·|ΔT_h| + Cw·U_h²) and AIM-2
 * Q_h = C·(S_h + W_h + B·√(S_h·W_h))ⁿ with S_h = f_s^(1/n)·ρ_h·g·H·|ΔT_h|/T_in and
 * W_h = f_w^(1/n)·ρ_h·(s·U_eave,h)²/2 (the combination of aim2.ts rearranged, as
 * plan/kernel-aim2.ts does). What depends only on the hour is worked out once here; a state
 * then costs, for LBL, one ELA, and for AIM-2 one power for each distinct hour with both
 * stack and wind (aim2-hourly.ts).
 */
export function hourlyAirflowMethod(
  home: HomeFile,
  exponentN: number,
  year: WeatherYear,
  basis: HourlyBasis,
): (leakage: LeakageByLocation) => HourlyAirflowCfm {
  checkWeatherYear(year);
  checkHourlyBasis(basis);
  const { house, climate } = home;
  const volumeFt3 = house.conditionedVolumeFt3;
  const hasCooling = Boolean(home.cooling);
  const method = home.infiltrationMethod;

  switch (method) {
    case 'nFactor': {
      const nFactor = nFactorOfHome(home);
      return (leakage) => {
        const { cfmNatural } = nFactorInfiltration({
          cfm50: totalCfm50Of(leakage),
          volumeFt3,
          nFactor,
        });
        const coolingCfm = hasCooling ? cfmNatural : 0;
        return { heatingCfm: cfmNatural, coolingCfm, coolingLatentCfm: coolingCfm };
      };
    }
    case 'ashrae622': {
      const wsf = requireMethodInput(climate.wsf, 'climate.wsf', method);
      return (leakage) => {
        const cfm = effectiveAnnualInfiltrationCfm({
          cfm50: totalCfm50Of(leakage),
          wsf,
          heightFt: house.heightFt,
        });
        const coolingCfm = hasCooling ? cfm : 0;
        return { heatingCfm: cfm, coolingCfm, coolingLatentCfm: coolingCfm };
      };
    }
    case 'lblBasic':
      return lblBasicHourly(home, exponentN, seasonHoursOf(year, basis, hasCooling));
    case 'aim2':
      return aim2Hourly(home, exponentN, year, seasonHoursOf(year, basis, hasCooling));
  }
}

/**
 * An AIM-2 home's seasons as its hourly flow works on them (aim2-hourly.ts): the groups of
 * hours' stack and wind pressures and their weights, for the best package's bound.
 */
export function hourlyAim2Pressures(
  home: HomeFile,
  exponentN: number,
  year: WeatherYear,
  basis: HourlyBasis,
): Aim2SeasonPressures {
  return aim2SeasonPressures(
    home,
    exponentN,
    year,
    seasonHoursOf(year, basis, Boolean(home.cooling)),
  );
}

/**
 * LBL basic: Q_h = ELA·q_h with q_h = √(Cs·|ΔT_h| + Cw·U_h²), so each season's weighted mean
 * is ELA·Σ w·q / Σ w, the sums taken once.
 */
function lblBasicHourly(
  home: HomeFile,
  exponentN: number,
  seasons: { heating: SeasonHours; cooling: SeasonHours | null },
): (leakage: LeakageByLocation) => HourlyAirflowCfm {
  const stackCoefficient = lblStackCoefficientIp(home.house.stories);
  const windCoefficient = lblWindCoefficientIp(home.house.shelterClass, home.house.stories);
  const flowPerAreaSums = (season: SeasonHours) => {
    let sensible = 0;
    let latent = 0;
    for (let index = 0; index < season.count; index += 1) {
      const windMph = season.windMph[index]!;
      const perIn2 = Math.sqrt(
        stackCoefficient * Math.abs(season.deltaTF[index]!) + windCoefficient * windMph * windMph,
      );
      sensible += perIn2 * season.weight[index]!;
      latent += perIn2 * season.latentWeight[index]!;
    }
    return {
      sensible: weightedMean(sensible, season.totalWeight),
      latent: weightedMean(latent, season.totalLatentWeight),
    };
  };
  const heating = flowPerAreaSums(seasons.heating);
  const cooling = seasons.cooling ? flowPerAreaSums(seasons.cooling) : { sensible: 0, latent: 0 };
  return (leakage) => {
    const ela = elaIn2(totalCfm50Of(leakage), exponentN);
    return {
      heatingCfm: ela * heating.sensible,
      coolingCfm: ela * cooling.sensible,
      coolingLatentCfm: ela * cooling.latent,
    };
  };
}
