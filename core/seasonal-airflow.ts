/**
 * Natural infiltration of a leakage state by the method the home file chose, for the
 * heating and the cooling season. Each method is one `case`; adding a method is adding one.
 */
import { airDensityKgPerM3, standardPressurePa } from './air.ts';
import { METERS_PER_FOOT } from './constants.ts';
import type { SeasonalAirflowCfm } from './energy.ts';
import { InputError } from './errors.ts';
import type { LeakageByLocation } from './home-model.ts';
import { aim2Infiltration } from './infiltration/aim2.ts';
import { effectiveAnnualInfiltrationCfm } from './infiltration/ashrae-622.ts';
import { lblBasicInfiltration } from './infiltration/lbl-basic.ts';
import {
  lblNFactor,
  nFactorInfiltration,
  shieldingForShelterClass,
} from './infiltration/n-factor.ts';
import { elaIn2 } from './leakage.ts';
import { LEAK_LOCATIONS, type HomeFile } from './schema.ts';

/** Indoor temperatures assumed when a season gives none, °F. Common practice. */
export const DEFAULT_INDOOR_HEATING_F = 68;
export const DEFAULT_INDOOR_COOLING_F = 75;

type Season = NonNullable<HomeFile['climate']['heatingSeason']>;

function totalOf(leakage: LeakageByLocation): number {
  return LEAK_LOCATIONS.reduce((total, location) => total + leakage[location], 0);
}

/** A climate or home field a method needs, or an InputError naming it. */
export function requireMethodInput<T>(value: T | undefined, path: string, method: string): T {
  if (value === undefined)
    throw InputError.at(path, `is required for infiltrationMethod "${method}"`);
  return value;
}

/** The N-factor of a home: its override, else the LBL table's for its zone, stories, shelter. */
export function nFactorOfHome(home: HomeFile): number {
  return (
    home.nFactorOverride ??
    lblNFactor({
      zone: requireMethodInput(home.climate.nFactorZone, 'climate.nFactorZone', 'nFactor'),
      stories: home.house.stories,
      shielding: shieldingForShelterClass(home.house.shelterClass),
    })
  );
}

/**
 * The chosen infiltration method as a function of the leakage state.
 *
 * @param home - the parsed home file (method, house, climate)
 * @param exponentN - the house's flow exponent from its test
 * @returns leakage by location (CFM50) → mean heating- and cooling-season infiltration, cfm
 */
export function seasonalAirflowMethod(
  home: HomeFile,
  exponentN: number,
): (leakage: LeakageByLocation) => SeasonalAirflowCfm {
  const { house, climate } = home;
  const volumeFt3 = house.conditionedVolumeFt3;
  const hasCooling = Boolean(home.cooling);
  const method = home.infiltrationMethod;

  switch (method) {
    case 'nFactor': {
      const nFactor = nFactorOfHome(home);
      return (leakage) => {
        const { cfmNatural } = nFactorInfiltration({ cfm50: totalOf(leakage), volumeFt3, nFactor });
        return { heatingCfm: cfmNatural, coolingCfm: hasCooling ? cfmNatural : 0 };
      };
    }
    case 'lblBasic': {
      const heatingSeason = requireMethodInput(
        climate.heatingSeason,
        'climate.heatingSeason',
        method,
      );
      const coolingSeason = climate.coolingSeason;
      const flowAt = (ela: number, season: Season) =>
        lblBasicInfiltration({
          elaIn2: ela,
          stories: house.stories,
          shelterClass: house.shelterClass,
          deltaTF: season.meanDeltaTF,
          windSpeedMph: season.meanWindSpeedMph,
          volumeFt3,
        }).cfmNatural;
      return (leakage) => {
        const ela = elaIn2(totalOf(leakage), exponentN);
        return {
          heatingCfm: flowAt(ela, heatingSeason),
          coolingCfm: hasCooling && coolingSeason ? flowAt(ela, coolingSeason) : 0,
        };
      };
    }
    case 'aim2': {
      const heatingSeason = requireMethodInput(
        climate.heatingSeason,
        'climate.heatingSeason',
        method,
      );
      const coolingSeason = climate.coolingSeason;
      const sitePressurePa = standardPressurePa(climate.elevationFt * METERS_PER_FOOT);
      const flowAt = (leakage: LeakageByLocation, season: Season, kind: 'heating' | 'cooling') => {
        const cfm50 = totalOf(leakage);
        if (cfm50 <= 0) return 0;
        const indoorTempF =
          season.indoorTempF ??
          (kind === 'heating' ? DEFAULT_INDOOR_HEATING_F : DEFAULT_INDOOR_COOLING_F);
        const outdoorTempF =
          kind === 'heating' ? indoorTempF - season.meanDeltaTF : indoorTempF + season.meanDeltaTF;
        return aim2Infiltration({
          coefficientCfmPerPaN: cfm50 / 50 ** exponentN,
          exponentN,
          leakShares: {
            ceiling: leakage.ceiling / cfm50,
            wall: leakage.wall / cfm50,
            floor: leakage.floor / cfm50,
            flue: leakage.flue / cfm50,
          },
          heightFt: house.heightFt,
          indoorTempF,
          deltaTF: season.meanDeltaTF,
          windSpeedMph: season.meanWindSpeedMph,
          shelterClass: house.shelterClass,
          foundation: house.foundation,
          volumeFt3,
          ...(house.flueHeightFt === undefined ? {} : { flueHeightFt: house.flueHeightFt }),
          ...(house.siteTerrain === undefined ? {} : { siteTerrain: house.siteTerrain }),
          // Outdoor air drives stack and wind; its density follows the site's pressure.
          airDensityKgPerM3: airDensityKgPerM3(((outdoorTempF - 32) * 5) / 9, sitePressurePa),
        }).cfmNatural;
      };
      return (leakage) => ({
        heatingCfm: flowAt(leakage, heatingSeason, 'heating'),
        coolingCfm: hasCooling && coolingSeason ? flowAt(leakage, coolingSeason, 'cooling') : 0,
      });
    }
    case 'ashrae622': {
      const wsf = requireMethodInput(climate.wsf, 'climate.wsf', method);
      return (leakage) => {
        const cfm = effectiveAnnualInfiltrationCfm({
          cfm50: totalOf(leakage),
          wsf,
          heightFt: house.heightFt,
        });
        return { heatingCfm: cfm, coolingCfm: hasCooling ? cfm : 0 };
      };
    }
  }
}
