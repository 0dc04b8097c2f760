/**
 * Database chores for the bootstrap: `migrate` applies the committed migrations,
 * `migrate-and-seed` also seeds the demo shop once, `reset` drops everything (tests only).
 */
import { MikroORM } from '@mikro-orm/postgresql';
import config from '../mikro-orm.config';
import { DemoSeeder } from '../src/server/seeders/demo.seeder';

const command = process.argv[2] ?? 'migrate';
const orm = await MikroORM.init({ ...config, clientUrl: process.env.DATABASE_URL ?? config.clientUrl });
try {
  const done = await orm.migrator.up();
  console.log(done.length ? `  applied ${done.length} migration(s): ${done.map((m) => m.name).join(', ')}` : '  migrations up to date');
  if (command === 'migrate-and-seed') {
    const seeded = await orm.em.getConnection().execute(`select count(*)::int as n from "organization"`);
    if ((seeded[0] as { n: number }).n === 0) {
      await orm.seeder.seed(DemoSeeder);
      console.log('  seeded the demo shop');
    } else {
      console.log('  demo data already present');
    }
  }
} finally {
  await orm.close(true);
}
