import * as path from 'node:path';
import { loadMaterialHazards, loadSafetyNotices, loadScenario } from './content';
import { createMigrationDataSource } from './data-source';
import { runMigrations, seedDatabase } from './seed/seed';

/** Repository root, found from this file's location (db/dist/src/cli.js). */
const repoRoot = path.resolve(__dirname, '..', '..', '..');

async function main(command: string | undefined): Promise<void> {
  if (command === 'demo-users') {
    const s = loadScenario(path.join(repoRoot, 'samples'));
    for (const u of s.users) console.log(`    ${u.role.padEnd(11)} ${u.email}`);
    console.log(`    password for all: ${s.demoPassword}`);
    return;
  }
  const ds = createMigrationDataSource();
  await ds.initialize();
  try {
    if (command === 'migrate') {
      const ran = await runMigrations(ds);
      console.log(ran.length ? `migrations applied: ${ran.join(', ')}` : 'migrations: up to date');
    } else if (command === 'seed') {
      const production = process.env.KW_MODE === 'production';
      const hazards = loadMaterialHazards(path.join(repoRoot, 'safety', 'material-hazards.json'));
      const notices = loadSafetyNotices(path.join(repoRoot, 'safety', 'notices'));
      const scenario = loadScenario(path.join(repoRoot, 'samples'), { hazards });
      const r = await seedDatabase(ds, { production, notices, hazards, scenario });
      console.log(
        `seed: ${r.noticesAdded} notice versions, ${r.usersCreated} users, ${r.materialsCreated} materials, ` +
          `${r.profilesCreated} machine profiles, ${r.designsCreated} designs, ${r.jobsCreated} jobs added` +
          (production ? ' (production: safety content only, demo accounts off)' : ''),
      );
    } else {
      throw new Error(`usage: node db/dist/src/cli.js migrate|seed|demo-users (got "${command ?? ''}")`);
    }
  } finally {
    await ds.destroy();
  }
}

main(process.argv[2]).catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
