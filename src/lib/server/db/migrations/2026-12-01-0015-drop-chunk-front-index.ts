import type { QueryInterface } from 'sequelize';

/**
 * The live front reads sweep_front_marks (0014), so the (sweep_id, chunk_front) index of
 * sweep_cases serves no query any more; every secondary index costs insert speed. The
 * chunk_front column stays (it records the mark with the case).
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.sequelize.query('ALTER TABLE sweep_cases DROP INDEX sweep_cases_chunk_front');
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.sequelize.query('ALTER TABLE sweep_cases ADD INDEX sweep_cases_chunk_front (sweep_id, chunk_front)');
}
