// Web bundle shim for zod's `locales/index.js`: the app speaks English only, so the
// other ~50 locale tables are left out (metro.config.js points zod's import here).
export { default as en } from 'zod/v4/locales/en.js';
