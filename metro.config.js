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

module.exports = config;
