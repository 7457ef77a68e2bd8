/**
 * Envelope leakage from a blower-door test: the power-law fit of a multipoint test, the
 * one-point shortcut, and the figures the trade derives from it (ACH50, ELA, EqLA,
 * normalized leakage, CFM50 per square foot of envelope).
 *
 * The fit and its warnings are in leakage/fit.ts, the derived figures in leakage/areas.ts;
 * callers import them from here.
 */
export type { BlowerDoorPoint, LeakageFit, LeakageWarning } from './leakage/fit.ts';
export { fitMultipointTest, onePointTest } from './leakage/fit.ts';
export {
  ach50,
  cfm50FromElaIn2,
  cfm50PerEnvelopeFt2,
  elaIn2,
  eqlaIn2,
  estimateEnvelopeAreaFt2,
  leakageAreaIn2,
  normalizedLeakage,
} from './leakage/areas.ts';
