/**
 * Migration runner (umzug) over an explicit, ordered list, so the same migrations run
 * from the CLI, the worker, the tests and a bundled server. Add a migration: write
 * migrations/<date>-<nnnn>-<what>.ts with up/down and append it to MIGRATIONS.
 */
import { SequelizeStorage, Umzug } from 'umzug';
import type { QueryInterface } from 'sequelize';
import { sequelize } from './sequelize';
import * as m0001 from './migrations/2026-12-01-0001-auth';
import * as m0002 from './migrations/2026-12-01-0002-api-tokens';
import * as m0003 from './migrations/2026-12-01-0003-mail-messages';
import * as m0010 from './migrations/2026-12-01-0010-studies-sweeps';
import * as m0011 from './migrations/2026-12-01-0011-sweep-cases';

type Step = (p: { context: QueryInterface }) => Promise<void>;
const MIGRATIONS: { name: string; up: Step; down: Step }[] = [
  { name: '2026-12-01-0001-auth', ...m0001 },
  { name: '2026-12-01-0002-api-tokens', ...m0002 },
  { name: '2026-12-01-0003-mail-messages', ...m0003 },
  { name: '2026-12-01-0010-studies-sweeps', ...m0010 },
  { name: '2026-12-01-0011-sweep-cases', ...m0011 }
];

export function migrator(log = false) {
  return new Umzug({
    migrations: MIGRATIONS.map((m) => ({ name: m.name, up: m.up, down: m.down })),
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: log ? console : undefined
  });
}

export async function migrateUp(log = false) {
  return migrator(log).up();
}

export async function migrateDownAll(log = false) {
  return migrator(log).down({ to: 0 });
}
