/**
 * The parts a measure's trace is made of: a figure with its unit, an input with where it
 * comes from, and a line (what is worked out, the formula in symbols, its inputs and its
 * result). Plain JSON, so a trace travels to the screens as it is.
 */
import type { Evaluation } from '../evaluate.ts';
import type { VentilatedAirflow } from '../home-model.ts';
import { centsToNumber, type Decimal } from '../money.ts';
import type { PlanEntry } from '../plan.ts';
import type { Fuel, Measure } from '../schema.ts';
import type { PriceBook } from './prices.ts';

/**
 * Quantities whose unit the screens change with the unit system (the names of
 * ui/quantities.ts); a figure without one is shown in the unit it carries.
 */
export const TRACE_QUANTITIES = [
  'flowCfm',
  'lengthFt',
  'volumeFt3',
  'leakageAreaIn2',
  'degreeDaysF',
  'temperatureDifferenceF',
] as const;
export type TraceQuantity = (typeof TRACE_QUANTITIES)[number];

/** A figure: a number in `unit`, or null where there is none (no SIR for a free measure). */
export interface TraceFigure {
  value: number | null;
  /** The unit of `value` as the engine holds it ("cfm", "Btu", "USD/yr"); "" for a pure number. */
  unit: string;
  /** Set when the figure converts for SI display. */
  quantity?: TraceQuantity;
}

/** One input of a line. */
export interface TraceInput extends TraceFigure {
  /** What it is, in plain words. */
  label: string;
  /** Where it comes from: the home file, a published source, an earlier line. */
  source?: string;
}

/** One step of the working: what is worked out, how, from what, and what comes out. */
export interface TraceLine {
  /** Stable name of the line, e.g. `heating-load-saved`. */
  key: string;
  /** What the line works out, in plain words. */
  label: string;
  /** The formula in symbols. */
  formula: string;
  inputs: TraceInput[];
  result: TraceFigure;
  /** Why the result is what it is, where that needs saying (a limit met, no SIR). */
  note?: string;
}

/** A figure; the quantity only when it converts. */
export function figure(value: number | null, unit: string, quantity?: TraceQuantity): TraceFigure {
  return quantity === undefined ? { value, unit } : { value, unit, quantity };
}

/** An input of a line. */
export function input(
  label: string,
  value: number | null,
  unit: string,
  extra: { source?: string; quantity?: TraceQuantity } = {},
): TraceInput {
  return {
    label,
    ...figure(value, unit, extra.quantity),
    ...(extra.source === undefined ? {} : { source: extra.source }),
  };
}

/** Money as the report gives it: to the cent. */
export function cents(amountUsd: Decimal): number {
  return centsToNumber(amountUsd);
}

/** A ratio or a number of years as the report gives it: to four decimals; null stays null. */
export function fourPlaces(value: Decimal | null): number | null {
  return value === null ? null : value.toDecimalPlaces(4).toNumber();
}

/** A leakage figure, CFM50 (L/s at 50 Pa in SI). */
export function leakage(label: string, cfm50: number, source?: string): TraceInput {
  return input(label, cfm50, 'CFM50', {
    quantity: 'flowCfm',
    ...(source === undefined ? {} : { source }),
  });
}

/** An air flow, cfm (L/s in SI). */
export function airflow(label: string, cfm: number, source?: string): TraceInput {
  return input(label, cfm, 'cfm', {
    quantity: 'flowCfm',
    ...(source === undefined ? {} : { source }),
  });
}

/** What the line builders work from: the evaluation, the measure's entry and its air flows. */
export interface TraceContext {
  evaluation: Evaluation;
  entry: PlanEntry;
  /** The measure as the home file gives it. */
  written: Measure;
  prices: PriceBook;
  flows: { before: VentilatedAirflow; after: VentilatedAirflow };
}

/** Fuels in plain words, for the labels. */
export const FUEL_NAMES: Readonly<Record<Fuel, string>> = {
  naturalGas: 'natural gas',
  propane: 'propane',
  heatingOil: 'heating oil',
  kerosene: 'kerosene',
  electricity: 'electricity',
  wood: 'wood',
  pellets: 'pellets',
};

/** The electricity a step saves beside heating, in symbols. */
export function electricTerm(cools: boolean): string {
  return cools ? '(ΔkWh_cool + ΔkWh_fan)' : 'ΔkWh_fan';
}
