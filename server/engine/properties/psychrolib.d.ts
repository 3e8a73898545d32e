// Types for the parts of the psychrolib package (ASHRAE psychrometric functions) the engine uses.
declare module 'psychrolib' {
  interface Psychrolib {
    readonly SI: number;
    readonly IP: number;
    SetUnitSystem(unitSystem: number): void;
    GetUnitSystem(): number | undefined;
    /** Humidity ratio, kg water / kg dry air (SI): dry-bulb °C, RH 0–1, pressure Pa. */
    GetHumRatioFromRelHum(tDryBulbC: number, relHum: number, pressurePa: number): number;
    /** Saturation vapour pressure over liquid water or ice, Pa (SI): dry-bulb °C, −100 to 200 °C. */
    GetSatVapPres(tDryBulbC: number): number;
  }
  const psychrolib: Psychrolib;
  export default psychrolib;
}
