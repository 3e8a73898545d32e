import { ensureWebBuild } from './web-build';

/** `npm run web:build`: rebuild the web bundle now, stale or not. */
const { seconds } = ensureWebBuild({ force: true });
console.log(`web bundle ready in dist/ (${seconds.toFixed(1)} s)`);
