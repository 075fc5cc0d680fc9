import 'reflect-metadata';
import { DataSource } from 'typeorm';
import { Redis } from 'ioredis';
import { redisConnection } from '../src/config/configuration.js';
import { dataSourceOptions } from '../src/database/data-source.js';
import { demoSignIns, seedDemo } from '../src/database/demo-seed.js';
import { requireE2eEnv } from './support/env.js';

/** Fresh schema from the migrations, the demo users seeded, Redis empty. */
export default async function setup(): Promise<void> {
  const { databaseUrl, redisUrl, credentialsFile } = requireE2eEnv();
  const db = new DataSource(dataSourceOptions(databaseUrl));
  await db.initialize();
  try {
    await db.query('DROP SCHEMA public CASCADE');
    await db.query('CREATE SCHEMA public');
    await db.runMigrations({ transaction: 'each' });
    await seedDemo(db, demoSignIns(credentialsFile));
  } finally {
    await db.destroy();
  }
  const redis = new Redis(redisConnection(redisUrl));
  await redis.flushdb();
  await redis.quit();
}
