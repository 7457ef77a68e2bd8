/**
 * The cooling lines of a measure's trace, for a home that cools: the cooling-season outdoor
 * air before and after the step, the sensible and the moisture (latent) load it saves, and
 * the cooling electricity.
 */
import { pressureRatioAtElevation } from '../air.ts';
import { AIR_LATENT_BTU_PER_HOUR_CFM_GRAIN } from '../constants.ts';
import { seasonalLatentLoadBtu } from '../energy.ts';
import { airflowLine, sensibleLine } from './trace-air.ts';
import { airflow, figure, input, type TraceContext, type TraceLine } from './trace-parts.ts';

/** Hour by hour, the latent load's air is its own mean: weighted by each hour's moisture. */
const LATENT_MEAN_SOURCE =
  'the cooling hours’ infiltration weighted by each hour’s moisture excess, with the fan';

/** The cooling lines, when the home cools: air, sensible and latent load, electricity. */
export function coolingLines(context: TraceContext): TraceLine[] {
  const { home } = context.evaluation;
  const cooling = home.cooling;
  if (!cooling) return [];
  const { climate } = home;
  const saved = context.entry.step.saved;
  const { combined: beforeFlows } = context.flows.before;
  const { combined: afterFlows } = context.flows.after;
  const before = beforeFlows.coolingLatentCfm ?? beforeFlows.coolingCfm;
  const after = afterFlows.coolingLatentCfm ?? afterFlows.coolingCfm;
  const basis = context.evaluation.model.climateBasis;
  const grainHours = context.evaluation.model.energyContext.seasons.latentGrainHours;
  const latentOf = (airflowCfm: number) =>
    seasonalLatentLoadBtu({
      airflowCfm,
      latentGrainHours: grainHours,
      elevationFt: climate.elevationFt,
    });
  const sensible = sensibleLine(context, 'cooling');
  const latent: TraceLine = {
    key: 'cooling-latent-saved',
    label: 'Cooling load saved in a year, moisture (latent) part',
    formula: 'ΔQ_lat = 0.68 Btu/(h·cfm·grain/lb) × p/p₀ × (Q_before − Q_after) × G',
    inputs: [
      input(
        'Latent factor of sea-level air',
        AIR_LATENT_BTU_PER_HOUR_CFM_GRAIN,
        'Btu/(h·cfm·grain/lb)',
        {
          source: 'ASHRAE HoF, load calculation chapter (0.68, from memory)',
        },
      ),
      input('Site pressure ratio p/p₀', pressureRatioAtElevation(climate.elevationFt), '', {
        source: 'line: site pressure ratio',
      }),
      ...(basis.kind === 'hourly'
        ? [
            airflow('Outdoor air before Q_before', before, LATENT_MEAN_SOURCE),
            airflow('Outdoor air after Q_after', after, LATENT_MEAN_SOURCE),
          ]
        : [
            airflow('Outdoor air before Q_before', before, 'line: cooling-season air before'),
            airflow('Outdoor air after Q_after', after, 'line: cooling-season air after'),
          ]),
      input('Moisture excess over the cooling hours G', grainHours, 'grain/lb·h', {
        source:
          basis.kind === 'hourly'
            ? `the cooling hours of “${basis.weatherName}”, from their dew points`
            : climate.coolingSeason?.latentGrainHours === undefined
              ? 'none given for the climate, so 0'
              : `climate “${climate.name}” (coolingSeason.latentGrainHours)`,
      }),
    ],
    result: figure(latentOf(before) - latentOf(after), 'Btu'),
  };
  const total: TraceLine = {
    key: 'cooling-load-saved',
    label: 'Cooling load saved in a year',
    formula: 'ΔQ_cool = ΔQ_sens + ΔQ_lat',
    inputs: [
      input('Sensible part ΔQ_sens', sensible.result.value, 'Btu', { source: 'line above' }),
      input('Latent part ΔQ_lat', latent.result.value, 'Btu', { source: 'line above' }),
    ],
    result: figure(saved.coolingLoadBtu, 'Btu'),
  };
  const kwh: TraceLine = {
    key: 'cooling-kwh-saved',
    label: 'Cooling electricity saved in a year',
    formula: 'ΔkWh_cool = ΔQ_cool ÷ (SEER × η_dist) ÷ 1000 Wh/kWh',
    inputs: [
      input('Cooling load saved ΔQ_cool', saved.coolingLoadBtu, 'Btu', { source: 'line above' }),
      input('Cooling SEER', cooling.seer, 'Btu/Wh', { source: 'the home file (cooling.seer)' }),
      input('Distribution efficiency η_dist', cooling.distributionEfficiency ?? 1, '', {
        source:
          cooling.distributionEfficiency === undefined
            ? 'none given in the home file, so 1'
            : 'the home file (cooling.distributionEfficiency)',
      }),
    ],
    result: figure(saved.coolingKwh, 'kWh'),
  };
  return [
    airflowLine(context, 'cooling', 'before'),
    airflowLine(context, 'cooling', 'after'),
    sensible,
    latent,
    total,
    kwh,
  ];
}
