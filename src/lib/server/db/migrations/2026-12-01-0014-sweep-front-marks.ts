import type { QueryInterface } from 'sequelize';

/**
 * The live front's candidates: each chunk's own non-dominated feasible cases with just their
 * objective values (o1..o4 in the sweep's objective order), written in the chunk's commit.
 * A narrow table read by primary-key range, so merging the live front of a million-case sweep
 * reads ~40 bytes a candidate instead of whole case rows. Emptied when the sweep is ranked.
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.sequelize.query(`
CREATE TABLE sweep_front_marks (
  sweep_id INT UNSIGNED NOT NULL,
  case_index INT UNSIGNED NOT NULL,
  o1 DOUBLE NOT NULL,
  o2 DOUBLE NOT NULL,
  o3 DOUBLE NULL,
  o4 DOUBLE NULL,
  PRIMARY KEY (sweep_id, case_index)
) ENGINE=InnoDB`);
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.dropTable('sweep_front_marks');
}
