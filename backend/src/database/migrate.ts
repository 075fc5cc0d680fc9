import 'reflect-metadata';
import { DataSource } from 'typeorm';
import { dataSourceOptions } from './data-source.js';
import { seedCalibrationDemo } from './demo-calibration.js';
import { demoSignIns, seedDemo } from './demo-seed.js';

/**
 * `node dist/database/migrate.js [--seed CREDENTIALS.json]`: runs pending migrations, then (with
 * --seed) creates the demo shop's users, keeping their generated passwords in CREDENTIALS.json,
 * and the demo chamber's calibration history.
 */
async function main(): Promise<void> {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error('DATABASE_URL is not set');
  const seedIdx = process.argv.indexOf('--seed');
  const credentials = seedIdx >= 0 ? process.argv[seedIdx + 1] : undefined;
  if (seedIdx >= 0 && !credentials) throw new Error('--seed needs the path of the demo credentials file');
  const db = new DataSource(dataSourceOptions(url));
  await db.initialize();
  try {
    const ran = await db.runMigrations({ transaction: 'each' });
    console.log(`migrations: ${ran.length === 0 ? 'up to date' : ran.map((m) => m.name).join(', ')}`);
    if (credentials) {
      const created = await seedDemo(db, demoSignIns(credentials));
      console.log(`demo seed: ${created} record(s) created`);
      const runs = await seedCalibrationDemo(db);
      if (runs > 0) console.log(`demo seed: ${runs} diagnosed chamber runs for the calibration history`);
    }
  } finally {
    await db.destroy();
  }
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
