// Types for the parts of psychrolib 1.1.1 (a reference library used only by tests) that the tests call.
declare module 'psychrolib' {
  interface Psychrolib {
    SI: number;
    SetUnitSystem(unitSystem: number): void;
    /** saturation vapour pressure over liquid water (and ice below 0.01 C), Pa in SI units; temperature in deg C */
    GetSatVapPres(tDryBulbC: number): number;
  }
  const psychrolib: Psychrolib;
  export default psychrolib;
}
