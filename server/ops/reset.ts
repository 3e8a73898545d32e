import { Client } from 'pg';

import { ensureCluster } from './postgres';

/** `npm run reset`: drops the demo database; the next `npm start` recreates and reseeds it. */
async function main() {
  const cluster = await ensureCluster();
  const client = new Client({ connectionString: cluster.url('postgres') });
  await client.connect();
  await client.query('drop database if exists cyclemoot with (force)');
  await client.end();
  console.log('Demo database dropped; `npm start` writes fresh demo data.');
}

main().catch((error: Error) => {
  console.error(`reset failed: ${error.message}`);
  process.exit(1);
});
