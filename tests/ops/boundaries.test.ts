import path from 'node:path';

import { ESLint } from 'eslint';
import { beforeAll, describe, expect, it } from 'vitest';

import { repoRoot } from '@/server/ops/paths';

/**
 * The import boundaries of eslint.config.mjs, driven through ESLint itself on code written
 * as if it lived in each part of the tree. Each refused import must name the boundary; each
 * allowed one must pass, so a boundary cannot be widened or narrowed without a test failing.
 */
let eslint: ESLint;
beforeAll(() => {
  eslint = new ESLint({ cwd: repoRoot });
});

async function importErrors(file: string, code: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath: path.join(repoRoot, file) });
  return result.messages.filter((m) => m.ruleId === 'no-restricted-imports').map((m) => m.message);
}

const refused: [where: string, file: string, code: string, says: RegExp][] = [
  [
    'engine → outside by relative path',
    'server/engine/cycles/x.ts',
    "import { z } from '../../contracts/cycle';\nz;",
    /may not leave server\/engine/,
  ],
  [
    'engine → alias',
    'server/engine/x.ts',
    "import { db } from '@/db/client';\ndb;",
    /engine imports nothing outside itself/,
  ],
  ['engine → a package', 'server/engine/x.ts', "import { z } from 'zod';\nz;", /engine imports nothing outside itself/],
  [
    'engine → node',
    'server/engine/processes/x.ts',
    "import fs from 'node:fs';\nfs;",
    /engine imports nothing outside itself/,
  ],
  [
    'app → service',
    'app/(app)/x.tsx',
    "import { listReviews } from '@/server/services/reviews';\nlistReviews;",
    /only the pure contracts/,
  ],
  ['app → db', 'components/x.ts', "import { review } from '@/db/schema';\nreview;", /only the pure contracts/],
  [
    'app → routes, relative',
    'components/screens/x.ts',
    "import r from '../../server/routes/reviews';\nr;",
    /only the pure contracts/,
  ],
  [
    'app → realtime server',
    'components/data/x.ts',
    "import { attachRealtime } from '@/realtime/server';\nattachRealtime;",
    /only events\.ts/,
  ],
  [
    'db → server',
    'db/x.ts',
    "import { recordActivity } from '@/server/services/activity';\nrecordActivity;",
    /imports no server or app code/,
  ],
  [
    'db → out by relative path',
    'db/schema/x.ts',
    "import { a } from '../../server/auth/auth';\na;",
    /may not leave db/,
  ],
  [
    'contracts → service',
    'server/contracts/x.ts',
    "import { s } from '@/server/services/reviews';\ns;",
    /Contracts are pure/,
  ],
  ['contracts → node', 'server/contracts/x.ts', "import fs from 'node:fs';\nfs;", /Contracts are pure/],
  [
    'service → route',
    'server/services/x.ts',
    "import r from '@/server/routes/reviews';\nr;",
    /Services import no routes/,
  ],
  [
    'service → socket code',
    'server/services/x.ts',
    "import { attachRealtime } from '@/realtime/server';\nattachRealtime;",
    /Broadcast port/,
  ],
  [
    'service → express',
    'server/services/x.ts',
    "import express from 'express';\nexpress;",
    /Services import no routes/,
  ],
  [
    'route → database',
    'server/routes/x.ts',
    "import { review } from '@/db/schema';\nreview;",
    /do not touch the database/,
  ],
  ['route → drizzle', 'server/routes/x.ts', "import { eq } from 'drizzle-orm';\neq;", /do not touch the database/],
  [
    'socket handler → database',
    'realtime/handlers/x.ts',
    "import { teamMember } from '@/db/schema';\nteamMember;",
    /do not touch the database/,
  ],
];

const allowed: [where: string, file: string, code: string][] = [
  ['engine → psychrolib', 'server/engine/x.ts', "import psy from 'psychrolib';\npsy;"],
  ['engine → inside', 'server/engine/cycles/x.ts', "import { e } from '../errors';\ne;"],
  ['app → contracts', 'components/x.ts', "import { reviewSchema } from '@/server/contracts/review';\nreviewSchema;"],
  [
    'app → realtime events and client',
    'components/data/x.ts',
    "import type { ServerToClientEvents } from '@/realtime/events';\nimport { c } from '@/realtime/client';\nc;",
  ],
  [
    'contracts → engine limits',
    'server/contracts/x.ts',
    "import { limits } from '@/server/engine/input-limits';\nlimits;",
  ],
  ['service → database', 'server/services/x.ts', "import { review } from '@/db/schema';\nreview;"],
  [
    'route → Database type',
    'server/routes/x.ts',
    "import type { Database } from '@/db/client';\nexport type D = Database;",
  ],
];

describe('import boundaries, as ESLint enforces them', () => {
  it.each(refused)('refuses %s', async (_where, file, code, says) => {
    const errors = await importErrors(file, code);
    expect(errors.length, `no boundary error in ${file}`).toBeGreaterThan(0);
    expect(errors.join('\n')).toMatch(says);
  });
  it.each(allowed)('allows %s', async (_where, file, code) => {
    expect(await importErrors(file, code)).toEqual([]);
  });
});
