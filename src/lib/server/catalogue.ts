/**
 * Propulsion catalogue data module: list / read / create / update / destroy per workspace,
 * and the all-or-nothing import behind the CSV upload. Values are SI (see
 * $lib/schemas/catalogue); callers validate with CatalogueEntryInput first.
 */
import { Op, UniqueConstraintError } from 'sequelize';
import { sequelize } from './db/sequelize';
import { CatalogueEntry as Row } from './db/models';
import type { CatalogueEntry, CatalogueEntryInput } from '$lib/schemas/catalogue';
import { parseCatalogueCsv, type RowError } from '$lib/catalogue/csv';

export class DuplicateNameError extends Error {
  constructor(readonly entryName: string) {
    super(`An entry named "${entryName}" is already in this catalogue`);
    this.name = 'DuplicateNameError';
  }
}

function plain(r: Row): CatalogueEntry {
  return {
    id: r.id,
    workspaceId: r.workspaceId,
    name: r.name,
    propellants: r.propellants,
    ispSeaLevelS: r.ispSeaLevelS,
    ispVacuumS: r.ispVacuumS,
    thrustVacuumN: r.thrustVacuumN,
    massKg: r.massKg,
    notes: r.notes,
    createdAt: r.createdAt.toISOString(),
    updatedAt: r.updatedAt.toISOString()
  };
}

/** Only the entry's own fields, whatever else the caller's object carries (ids, workspace). */
function fields(e: CatalogueEntryInput): CatalogueEntryInput {
  const { name, propellants, ispSeaLevelS, ispVacuumS, thrustVacuumN, massKg, notes } = e;
  return { name, propellants, ispSeaLevelS, ispVacuumS, thrustVacuumN, massKg, notes };
}

export async function list(workspaceId: string): Promise<CatalogueEntry[]> {
  const rows = await Row.findAll({ where: { workspaceId }, order: [['name', 'ASC']] });
  return rows.map(plain);
}

export async function read(workspaceId: string, id: number): Promise<CatalogueEntry | null> {
  const r = await Row.findOne({ where: { id, workspaceId } });
  return r ? plain(r) : null;
}

export async function create(workspaceId: string, input: CatalogueEntryInput): Promise<CatalogueEntry> {
  try {
    return plain(await Row.create({ ...fields(input), workspaceId }));
  } catch (e) {
    if (e instanceof UniqueConstraintError) throw new DuplicateNameError(input.name);
    throw e;
  }
}

/** Updates one entry of the workspace; null when there is no such entry there. */
export async function update(workspaceId: string, id: number, input: CatalogueEntryInput): Promise<CatalogueEntry | null> {
  const r = await Row.findOne({ where: { id, workspaceId } });
  if (!r) return null;
  try {
    await r.update(fields(input));
  } catch (e) {
    if (e instanceof UniqueConstraintError) throw new DuplicateNameError(input.name);
    throw e;
  }
  return plain(r);
}

export async function destroy(workspaceId: string, id: number): Promise<boolean> {
  return (await Row.destroy({ where: { id, workspaceId } })) > 0;
}

/**
 * Inserts every entry or none: one transaction, rolled back on the first failure (the
 * unique (workspace, name) index is the last line of defence against duplicates).
 */
export async function importEntries(workspaceId: string, entries: CatalogueEntryInput[]): Promise<number> {
  try {
    await sequelize.transaction(async (transaction) => {
      for (const e of entries) await Row.create({ ...fields(e), workspaceId }, { transaction });
    });
  } catch (e) {
    if (e instanceof UniqueConstraintError) {
      const name = String((e.fields as Record<string, unknown>)?.name ?? e.errors[0]?.value ?? '');
      throw new DuplicateNameError(name);
    }
    throw e;
  }
  return entries.length;
}

export type ImportResult = { ok: true; imported: number } | { ok: false; errors: RowError[] };

/**
 * Validates a CSV file's text and imports it all or not at all. Names already in the
 * workspace's catalogue are errors on their rows.
 */
export async function importCsv(workspaceId: string, text: string): Promise<ImportResult> {
  const parsed = parseCatalogueCsv(text);
  if (parsed.errors.length) return { ok: false, errors: parsed.errors };

  const names = parsed.entries.map((e) => e.name);
  const clashes = await Row.findAll({ where: { workspaceId, name: { [Op.in]: names } }, attributes: ['name'] });
  if (clashes.length) {
    const taken = new Set(clashes.map((c) => c.name.toLowerCase()));
    const errors: RowError[] = [];
    parsed.entries.forEach((e, i) => {
      if (taken.has(e.name.toLowerCase())) {
        errors.push({ row: parsed.rows[i], field: 'name', message: `"${e.name}" is already in this catalogue` });
      }
    });
    return { ok: false, errors };
  }
  try {
    return { ok: true, imported: await importEntries(workspaceId, parsed.entries) };
  } catch (e) {
    if (e instanceof DuplicateNameError) return { ok: false, errors: [{ row: 0, field: 'name', message: e.message }] };
    throw e;
  }
}
