/**
 * The demo's invented hourly ambient year for Kestrel Fell, a cold inland site (310 m):
 * deterministic, made from a plausible annual and daily temperature swing with weather on
 * top. Not data of any place.
 *
 * - Annual: mean +2 °C, ±14 K, coldest around 20 January, warmest around 20 July (an inland
 *   climate lags the sun by about four weeks: common practice).
 * - Daily: coldest near 05:00, warmest near 15:00; ±3 K in winter to ±6 K in summer (clear
 *   continental days swing more in summer: common practice).
 * - Weather: a red-noise anomaly (an AR(1) process, about 2.5 days' memory, 4 K spread) from a
 *   seeded generator, so every run makes the same year.
 * - Relative humidity: about 85 % in winter and 65 % in summer, lower in the warm afternoon
 *   (about 2.5 % per kelvin above the day's mean), 20–100 %.
 */

import type { Database } from '@/db/client';
import { noBroadcast } from '@/server/services/broadcast';
import { putSiteYear } from '@/server/services/site-year';
import { parseProfileCsv } from '@/server/services/site-year-csv';

export type DemoYear = { temperatureK: number[]; relativeHumidity: number[] };

/** mulberry32: a small seeded generator (public domain), numbers in [0, 1). */
function generator(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export function demoSiteYear(hours = 8760, seed = 20261203): DemoYear {
  const random = generator(seed);
  const normal = () => {
    // Box–Muller
    const u = Math.max(random(), 1e-12);
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * random());
  };
  const memoryHours = 60;
  const rho = Math.exp(-1 / memoryHours);
  const spreadK = 4;
  const step = spreadK * Math.sqrt(1 - rho * rho);
  let weather = 0;
  let humidityNoise = 0;
  const temperatureK: number[] = [];
  const relativeHumidity: number[] = [];
  for (let h = 0; h < hours; h++) {
    const day = h / 24;
    const hourOfDay = h % 24;
    // Annual: coldest near day 20.
    const season = -Math.cos((2 * Math.PI * (day - 20)) / 365);
    const annualC = 2 + 14 * season;
    // Daily: 3 K amplitude in winter, 6 K in summer; warmest at 15:00.
    const dailyAmplitude = 4.5 + 1.5 * season;
    const daily = dailyAmplitude * Math.cos((2 * Math.PI * (hourOfDay - 15)) / 24);
    weather = rho * weather + step * normal();
    humidityNoise = 0.9 * humidityNoise + 0.02 * normal();
    const c = Math.min(34, Math.max(-42, annualC + daily + weather));
    const rh = 0.75 - 0.1 * season - 0.025 * daily + humidityNoise;
    temperatureK.push(Math.round((c + 273.15) * 100) / 100);
    relativeHumidity.push(Math.round(Math.min(1, Math.max(0.2, rh)) * 1000) / 1000);
  }
  return { temperatureK, relativeHumidity };
}

/** The year as the CSV the site-year upload reads: hour, temperature °C, RH %. */
export function demoSiteYearCsv(year: DemoYear = demoSiteYear()): string {
  const lines = ['hour,temperature °C,RH %'];
  for (let i = 0; i < year.temperatureK.length; i++)
    lines.push(`${i},${(year.temperatureK[i] - 273.15).toFixed(2)},${(year.relativeHumidity[i] * 100).toFixed(1)}`);
  return lines.join('\n') + '\n';
}

/**
 * Stores the demo year on a review through the same reader and service as an upload (so
 * Activity is written as for anyone).
 */
export async function seedDemoSiteYear(db: Database, reviewId: string, actorId: string) {
  const parsed = parseProfileCsv(Buffer.from(demoSiteYearCsv(), 'utf8'));
  return putSiteYear({ db, broadcast: noBroadcast, actorId }, reviewId, parsed, 'kestrel-fell-hourly-year.csv');
}
