/**
 * The few functions of the npm `psychrolib` package (PsychroLib 1.1.1, an implementation of
 * ASHRAE Handbook of Fundamentals 2017 ch. 1) that our reference tests call. The package
 * ships no type declarations. It keeps its unit system as global state: call
 * `SetUnitSystem` before anything else.
 */
declare module 'psychrolib' {
  interface Psychrometrics {
    /** Unit-system tokens for `SetUnitSystem`. */
    readonly IP: number;
    readonly SI: number;
    SetUnitSystem(unitSystem: number): void;
    /** Standard-atmosphere pressure: psia for an altitude in ft (IP), Pa for m (SI). */
    GetStandardAtmPressure(altitude: number): number;
    /** Dry-air density: lb/ft³ from °F and psia (IP), kg/m³ from °C and Pa (SI). */
    GetDryAirDensity(dryBulb: number, pressure: number): number;
  }
  const psychrolib: Psychrometrics;
  export default psychrolib;
}
