/**
 * Database command line: `tsx src/lib/server/db/cli.ts <command>` (or `npm run db -- <command>`).
 *   migrate        apply pending migrations
 *   rollback       undo the last migration
 *   rollback-all   undo every migration
 *   reset          undo every migration, then apply them all (test databases)
 *   seed           insert the demo scenario (idempotent)
 *   status         list applied and pending migrations
 */
import { migrator } from './migrate';
import { sequelize } from './sequelize';
import { seedDemo } from './seed';
import { config } from '../config';

async function main(cmd: string | undefined) {
  const m = migrator(false);
  switch (cmd) {
    case 'migrate': {
      const done = await m.up();
      console.log(`db ${config.DB_NAME}: ${done.length} migration(s) applied`);
      break;
    }
    case 'rollback': {
      const undone = await m.down();
      console.log(`db ${config.DB_NAME}: rolled back ${undone.map((x) => x.name).join(', ') || 'nothing'}`);
      break;
    }
    case 'rollback-all': {
      const undone = await m.down({ to: 0 });
      console.log(`db ${config.DB_NAME}: rolled back ${undone.length} migration(s)`);
      break;
    }
    case 'reset': {
      if (config.LOFTWISE_ENV === 'production') throw new Error('reset refuses to run with LOFTWISE_ENV=production');
      await m.down({ to: 0 });
      const done = await m.up();
      console.log(`db ${config.DB_NAME}: reset, ${done.length} migration(s) applied`);
      break;
    }
    case 'seed': {
      await seedDemo();
      console.log(`db ${config.DB_NAME}: demo scenario seeded`);
      break;
    }
    case 'status': {
      const [executed, pending] = await Promise.all([m.executed(), m.pending()]);
      for (const e of executed) console.log(`applied  ${e.name}`);
      for (const p of pending) console.log(`pending  ${p.name}`);
      break;
    }
    default:
      console.error('usage: cli.ts migrate|rollback|rollback-all|reset|seed|status');
      process.exitCode = 2;
  }
}

main(process.argv[2])
  .catch((e) => {
    console.error(`db: ${e instanceof Error ? e.message : e}`);
    process.exitCode = 1;
  })
  .finally(() => sequelize.close());
