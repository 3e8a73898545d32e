// @ts-check
import js from '@eslint/js';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';
import tseslint from 'typescript-eslint';

/**
 * Import boundaries. Each entry names a part of the tree and the imports it may not make;
 * a relative import that climbs out of the part is refused as well, so no boundary can be
 * walked around with `../..`. Patterns are matched against the import as written (`@/…`).
 */
const boundaries = [
  {
    dir: 'server/engine',
    why: 'The engine imports nothing outside server/engine/ but psychrolib.',
    patterns: [{ regex: '^(?!\\.|psychrolib$)', message: 'The engine imports nothing outside itself but psychrolib.' }],
  },
  {
    dir: 'app',
    climbs: false,
    patterns: appPatterns(),
  },
  {
    dir: 'components',
    climbs: false,
    patterns: appPatterns(),
  },
  {
    dir: 'db',
    patterns: [
      {
        regex: '^@/(server|realtime|components|app)/',
        message: 'db/ holds tables, the client and migrations only; it imports no server or app code.',
      },
    ],
  },
  {
    dir: 'server/contracts',
    patterns: [
      {
        regex: '^(@/(db|realtime|components|app)/|@/server/(?!contracts/|engine(/|$))|node:|express$|pg$|drizzle-orm)',
        message: 'Contracts are pure and shared with the app: zod, other contracts and the engine’s limits only.',
      },
    ],
  },
  {
    dir: 'server/services',
    patterns: [
      {
        regex: '^(@/server/(routes|auth)/|@/realtime/|express$|socket\\.io)',
        message:
          'Services import no routes, no HTTP or socket code: they tell the room through the Broadcast port in server/services/broadcast.ts.',
      },
    ],
  },
  {
    dir: 'server/routes',
    patterns: [databasePattern('Routes')],
  },
  {
    dir: 'server/http',
    patterns: [databasePattern('HTTP plumbing')],
  },
  {
    dir: 'realtime',
    patterns: [databasePattern('Socket handlers')],
  },
];

function appPatterns() {
  return [
    {
      regex: '^(\\.\\./)*(@/)?(db|server/(?!contracts/))',
      message: 'The app imports from the server side only the pure contracts (server/contracts/).',
    },
    {
      regex: '^(\\.\\./)*(@/)?realtime/(?!events$|client$)',
      message: 'The app imports from realtime/ only events.ts (the shared contract) and client.ts.',
    },
  ];
}

/** The database is touched only in services (a `Database` type may be passed through). */
function databasePattern(who) {
  return {
    regex: '^(@/db/(?!client$)|drizzle-orm|pg$)',
    allowTypeImports: true,
    message: `${who} do not touch the database: call a service (server/services/).`,
  };
}

/** One config per folder depth, so a relative import that climbs out of `dir` is refused. */
function boundaryConfigs() {
  return boundaries.flatMap(({ dir, patterns, climbs = true }) =>
    [0, 1, 2, 3].map((depth) => ({
      files: [`${dir}/${'*/'.repeat(depth)}*.{ts,tsx}`],
      rules: {
        'no-restricted-imports': [
          'error',
          {
            patterns: [
              ...patterns,
              ...(climbs
                ? [
                    {
                      regex: `^(\\.\\./){${depth + 1}}`,
                      message: `A relative import may not leave ${dir}/; it is a boundary.`,
                    },
                  ]
                : []),
            ],
          },
        ],
      },
    })),
  );
}

export default tseslint.config(
  { ignores: ['node_modules/', 'dist/', '.data/', '.expo/', 'artifacts/', 'db/migrations/', 'expo-env.d.ts'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/no-require-imports': 'off',
    },
  },
  {
    // Tests build malformed and half-filled inputs on purpose, past what the types allow.
    files: ['tests/**/*.ts'],
    rules: { '@typescript-eslint/no-explicit-any': 'off' },
  },
  {
    files: ['app/**/*.{ts,tsx}', 'components/**/*.{ts,tsx}', 'realtime/client.ts'],
    ...reactHooks.configs.flat['recommended-latest'],
  },
  ...boundaryConfigs(),
);
