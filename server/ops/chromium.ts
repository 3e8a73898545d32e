import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';

export const chromiumPath = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

/** Installs Debian's Chromium for the browser tests when it is missing (as root). */
export function ensureChromium() {
  if (existsSync(chromiumPath)) return;
  if (process.getuid?.() !== 0) {
    throw new Error(`Chromium is missing at ${chromiumPath}. Install it once with: sudo apt-get install -y chromium`);
  }
  console.log('[chromium] missing: installing Debian package chromium (apt-get, about a minute)…');
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  spawnSync('apt-get', ['update', '-qq'], { stdio: 'inherit', env });
  const res = spawnSync('apt-get', ['install', '-y', '-qq', 'chromium'], { stdio: 'inherit', env });
  if (res.status !== 0 || !existsSync(chromiumPath))
    throw new Error('apt-get install chromium failed; see the output above.');
}
