/**
 * Migration runner (umzug) over an explicit, ordered list, so the same migrations run
 * from the CLI, the worker, the tests and a bundled server. Add a migration: write
 * migrations/<date>-<nnnn>-<what>.ts with up/down and append it to MIGRATIONS.
 */
import { SequelizeStorage, Umzug } from 'umzug';
import { DataTypes, type QueryInterface } from 'sequelize';
import { sequelize } from './sequelize';
import * as m0001 from './migrations/2026-12-01-0001-auth';
import * as m0002 from './migrations/2026-12-01-0002-api-tokens';
import * as m0003 from './migrations/2026-12-01-0003-mail-messages';
import * as m0010 from './migrations/2026-12-01-0010-studies-sweeps';
import * as m0011 from './migrations/2026-12-01-0011-sweep-cases';
import * as m0012 from './migrations/2026-12-01-0012-sweep-chunks-no-fk';
import * as m0013 from './migrations/2026-12-01-0013-sweep-case-columns';
import * as m0014 from './migrations/2026-12-01-0014-sweep-front-marks';
import * as m0015 from './migrations/2026-12-01-0015-drop-chunk-front-index';
import * as m0020 from './migrations/2026-12-01-0020-invites';
import * as m0021 from './migrations/2026-12-01-0021-catalogue';
import * as m0022 from './migrations/2026-12-01-0022-share-link-units';

type Step = (p: { context: QueryInterface }) => Promise<void>;
const MIGRATIONS: { name: string; up: Step; down: Step }[] = [
  { name: '2026-12-01-0001-auth', ...m0001 },
  { name: '2026-12-01-0002-api-tokens', ...m0002 },
  { name: '2026-12-01-0003-mail-messages', ...m0003 },
  { name: '2026-12-01-0010-studies-sweeps', ...m0010 },
  { name: '2026-12-01-0011-sweep-cases', ...m0011 },
  { name: '2026-12-01-0012-sweep-chunks-no-fk', ...m0012 },
  { name: '2026-12-01-0013-sweep-case-columns', ...m0013 },
  { name: '2026-12-01-0014-sweep-front-marks', ...m0014 },
  { name: '2026-12-01-0015-drop-chunk-front-index', ...m0015 },
  { name: '2026-12-01-0020-invites', ...m0020 },
  { name: '2026-12-01-0021-catalogue', ...m0021 },
  { name: '2026-12-01-0022-share-link-units', ...m0022 }
];

/** The ledger of applied migrations (umzug's default model would be created as utf8mb3). */
const SchemaMigration = sequelize.define(
  'SchemaMigration',
  { name: { type: DataTypes.STRING(255), allowNull: false, unique: true, primaryKey: true } },
  { tableName: 'schema_migrations', timestamps: false, charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci' }
);

export function migrator(log = false) {
  return new Umzug({
    migrations: MIGRATIONS.map((m) => ({ name: m.name, up: m.up, down: m.down })),
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ model: SchemaMigration }),
    logger: log ? console : undefined
  });
}

export async function migrateUp(log = false) {
  return migrator(log).up();
}

export async function migrateDownAll(log = false) {
  return migrator(log).down({ to: 0 });
}
