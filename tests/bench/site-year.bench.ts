/**
 * Site-year benchmark: one year of 8760 hours for five candidates (the five presets at the
 * demo basis), from the fixed machine through its rating curve and year, as GET site-year
 * computes it without its cache. Target ≤ 200 ms. Median of 15 runs after 5 warm-up runs,
 * and the first (cold) run. Run with `npm run bench`.
 */
import { profileDensities, siteYear, type CycleInput } from '@/server/engine';
import { demoSiteYear } from '@/server/ops/demo-site-year';
import { engineInputOf, type BasisCore } from '@/server/services/design-basis';
import { defaultDesignBasis, presetParameters } from '@/server/services/presets';

const targetMs = 200;
const year = demoSiteYear();
const profile = {
  temperatureK: Float64Array.from(year.temperatureK),
  relativeHumidity: Float64Array.from(year.relativeHumidity),
};
const basis = {
  ...defaultDesignBasis,
  ambient: { temperatureK: 258.15, pressureKPa: 97.7, relativeHumidity: 0.8 },
} as BasisCore;
const inputs = Object.values(presetParameters).map((p) => engineInputOf(basis, p) as unknown as CycleInput);

let sink = 0;
function run(): number {
  const start = performance.now();
  const densities = profileDensities(profile, 97.7);
  for (const input of inputs) {
    const r = siteYear(input, profile, { firedHoursPerYear: 6000, densities });
    sink += r.annual!.energyMWh;
  }
  return performance.now() - start;
}

const cold = run();
for (let i = 0; i < 5; i++) run();
const times = Array.from({ length: 15 }, run).sort((a, b) => a - b);
const median = times[7];
console.log(
  `site year, 8760 h × ${inputs.length} candidates: median ${median.toFixed(1)} ms (best ${times[0].toFixed(1)}, worst ${times[14].toFixed(1)}, first run ${cold.toFixed(1)}); target ≤ ${targetMs} ms ${median <= targetMs ? 'met' : 'NOT met'}`,
);
if (!Number.isFinite(sink)) throw new Error('no result');
