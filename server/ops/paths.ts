import { createHash } from 'node:crypto';
import { mkdirSync, statSync } from 'node:fs';
import path from 'node:path';

export const repoRoot = path.resolve(__dirname, '..', '..');

/** True when every directory from `dir` up to `/` can be entered by other users. */
function traversableByOthers(dir: string): boolean {
  for (let d = dir; ; d = path.dirname(d)) {
    try {
      if ((statSync(d).mode & 0o001) === 0) return false;
    } catch {
      return false;
    }
    if (d === path.dirname(d)) return true;
  }
}

/**
 * Where the project keeps its local services' state (database cluster, mail, secrets).
 * `.data/` in the checkout when the postgres OS user can reach it; otherwise a folder
 * under /var/tmp named after the checkout, so two checkouts never share a cluster.
 */
export function stateDir(): string {
  const fromEnv = process.env.CYCLEMOOT_STATE_DIR;
  const dir = fromEnv
    ? path.resolve(fromEnv)
    : traversableByOthers(repoRoot)
      ? path.join(repoRoot, '.data')
      : path.join('/var/tmp', `cyclemoot-${createHash('sha1').update(repoRoot).digest('hex').slice(0, 10)}`);
  mkdirSync(dir, { recursive: true, mode: 0o755 });
  return dir;
}
