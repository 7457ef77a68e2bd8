/**
 * What every chart of the screens shares: chart.js with the parts they use registered once,
 * colours read from the page's own palette (ui/styles), and axes drawn alike. Each chart
 * still says in words what it shows (its aria-label and the table beside it).
 */
import {
  BarController,
  BarElement,
  CategoryScale,
  Chart,
  Legend,
  LinearScale,
  LineController,
  LineElement,
  LogarithmicScale,
  PointElement,
  ScatterController,
  type ChartOptions,
} from 'chart.js';

/** The options of one axis, as a chart's `options.scales` takes them. */
export type AxisOptions = NonNullable<NonNullable<ChartOptions<'line'>['scales']>[string]>;

Chart.register(
  BarController,
  BarElement,
  ScatterController,
  LineController,
  PointElement,
  LineElement,
  LinearScale,
  LogarithmicScale,
  CategoryScale,
  Legend,
);

export { Chart };

/** A colour of the page's palette (`--spruce`), so charts keep Sealwork's colours. */
export function paletteColour(name: string): string {
  return getComputedStyle(document.documentElement).getPropertyValue(name).trim();
}

/**
 * A linear axis with a title and ticks in the page's ink.
 *
 * @param title - the axis title, with its unit ("Cumulative cost, USD")
 * @param tick - how a tick's value is written
 * @param min - the axis's lowest value (0 for amounts)
 */
export function linearAxis(
  title: string,
  tick: (value: number) => string,
  min?: number,
): AxisOptions {
  const ink = paletteColour('--ink');
  return {
    type: 'linear',
    ...(min === undefined ? {} : { min }),
    title: { display: true, text: title, color: ink },
    ticks: { color: ink, callback: (value) => tick(Number(value)) },
    grid: { color: paletteColour('--line-soft') },
  };
}

/** What every chart's options start from: drawn at once (printing and tests see it whole) and sized by its box. */
export const CHART_BASE = {
  animation: false,
  responsive: true,
  maintainAspectRatio: false,
} as const;

/**
 * The look of a chart's main series: the page's green line with amber points turned on
 * their corners, so points read without the colour.
 */
export function mainSeriesStyle() {
  return {
    borderColor: paletteColour('--spruce'),
    backgroundColor: paletteColour('--focus'),
    borderWidth: 2,
    pointRadius: 5,
    pointStyle: 'rectRot' as const,
  };
}
