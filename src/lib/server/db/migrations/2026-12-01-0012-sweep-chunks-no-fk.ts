import type { QueryInterface } from 'sequelize';

/**
 * sweep_chunks loses its foreign key to sweeps. InnoDB checks a foreign key by taking a
 * shared lock on the parent row; the chunk commit later locks that row FOR UPDATE, and a
 * concurrent pause/cancel UPDATE queued in between turned the S→X upgrade into a deadlock.
 * The ledger is written only by store.ts, which checks the sweep in the same transaction.
 */
async function fkName(qi: QueryInterface): Promise<string | null> {
  const [rows] = (await qi.sequelize.query(
    `SELECT CONSTRAINT_NAME AS name FROM information_schema.KEY_COLUMN_USAGE
     WHERE TABLE_SCHEMA = DATABASE() AND TABLE_NAME = 'sweep_chunks' AND REFERENCED_TABLE_NAME = 'sweeps'`
  )) as [{ name: string }[], unknown];
  return rows[0]?.name ?? null;
}

export async function up({ context: qi }: { context: QueryInterface }) {
  const name = await fkName(qi);
  if (name) await qi.sequelize.query(`ALTER TABLE sweep_chunks DROP FOREIGN KEY \`${name}\``);
}

export async function down({ context: qi }: { context: QueryInterface }) {
  if (await fkName(qi)) return;
  await qi.sequelize.query('DELETE c FROM sweep_chunks c LEFT JOIN sweeps s ON s.id = c.sweep_id WHERE s.id IS NULL');
  await qi.sequelize.query(
      'ALTER TABLE sweep_chunks ADD CONSTRAINT sweep_chunks_sweep_fk FOREIGN KEY (sweep_id) REFERENCES sweeps (id) ON DELETE CASCADE'
    );
}
