// Metro for the web export. Caches live under node_modules/.cache so a build never
// depends on (or fills) the machine's /tmp.
const fs = require('node:fs');
const path = require('node:path');
const { getDefaultConfig } = require('expo/metro-config');
const { FileStore } = require('metro-cache');

const cacheRoot = path.join(__dirname, 'node_modules', '.cache', 'metro');
const fileMapCache = path.join(__dirname, 'node_modules', '.cache', 'metro-file-map');
for (const dir of [cacheRoot, fileMapCache]) fs.mkdirSync(dir, { recursive: true });

const config = getDefaultConfig(__dirname);

config.cacheStores = [new FileStore({ root: cacheRoot })];
config.fileMapCacheDirectory = fileMapCache;
// Build output, data and artifacts are not source: keep them out of the file map.
const escape = (s) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
const existing = config.resolver.blockList;
config.resolver.blockList = [
  ...(Array.isArray(existing) ? existing : existing ? [existing] : []),
  ...['.data', 'dist', 'artifacts'].map((dir) => new RegExp(`^${escape(path.join(__dirname, dir))}\\/.*`)),
];

// zod re-exports every locale table as `z.locales`; nothing here uses them, and English
// (the default) is imported by zod directly. Point the re-export at an English-only shim.
const zodLocalesShim = path.join(__dirname, 'components', 'data', 'zod-english-only.js');
const defaultResolve = config.resolver.resolveRequest;
config.resolver.resolveRequest = (context, moduleName, platform) => {
  if (moduleName === '../locales/index.js' && /[\\/]node_modules[\\/]zod[\\/]v4[\\/]/.test(context.originModulePath)) {
    return { type: 'sourceFile', filePath: zodLocalesShim };
  }
  return (defaultResolve ?? context.resolveRequest)(context, moduleName, platform);
};

module.exports = config;
