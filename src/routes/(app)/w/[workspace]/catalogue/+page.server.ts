import { error, fail, redirect } from '@sveltejs/kit';
import { requireWorkspace } from '$lib/server/guard';
import { roleAtLeast } from '$lib/server/db/models';
import * as catalogue from '$lib/server/catalogue';
import { readEntryForm, valuesOf } from '$lib/catalogue/form';
import { CSV_MAX_BYTES } from '$lib/catalogue/csv';
import type { Actions, PageServerLoad } from './$types';

/** MIME types browsers send for .csv files (Windows spreadsheet installs report the Excel one). */
const CSV_TYPES = new Set(['text/csv', 'application/csv', 'text/plain', 'application/vnd.ms-excel', 'text/x-csv', '']);

export const load: PageServerLoad = async ({ locals, params, url }) => {
  const access = await requireWorkspace(locals, { slug: params.workspace });
  const entries = await catalogue.list(access.workspace.id);
  const canEdit = roleAtLeast(access.role, 'engineer');
  const editId = Number(url.searchParams.get('edit'));
  const editing = canEdit && Number.isInteger(editId) ? (entries.find((e) => e.id === editId) ?? null) : null;
  const units = locals.user!.units;
  return {
    ...access,
    entries,
    canEdit,
    units,
    editing: editing ? { id: editing.id, name: editing.name, values: valuesOf(editing, units) } : null,
    adding: canEdit && url.searchParams.has('add'),
    imported: Number(url.searchParams.get('imported')) || null
  };
};

function entryId(form: FormData): number {
  const id = Number(form.get('id'));
  if (!Number.isInteger(id) || id <= 0) error(400, 'Entry id missing');
  return id;
}

export const actions: Actions = {
  create: async ({ locals, params, request }) => {
    const { workspace } = await requireWorkspace(locals, { slug: params.workspace }, 'engineer');
    const r = readEntryForm(await request.formData(), locals.user!.units);
    if (!r.ok) return fail(400, { action: 'create' as const, values: r.values, errors: r.errors });
    try {
      await catalogue.create(workspace.id, r.entry);
    } catch (e) {
      if (e instanceof catalogue.DuplicateNameError) {
        return fail(400, { action: 'create' as const, values: r.values, errors: { name: e.message } });
      }
      throw e;
    }
    redirect(303, `/w/${workspace.slug}/catalogue`);
  },

  update: async ({ locals, params, request }) => {
    const { workspace } = await requireWorkspace(locals, { slug: params.workspace }, 'engineer');
    const form = await request.formData();
    const id = entryId(form);
    const r = readEntryForm(form, locals.user!.units);
    if (!r.ok) return fail(400, { action: 'update' as const, id, values: r.values, errors: r.errors });
    try {
      const done = await catalogue.update(workspace.id, id, r.entry);
      if (!done) error(404, 'That catalogue entry does not exist (it may have been deleted)');
    } catch (e) {
      if (e instanceof catalogue.DuplicateNameError) {
        return fail(400, { action: 'update' as const, id, values: r.values, errors: { name: e.message } });
      }
      throw e;
    }
    redirect(303, `/w/${workspace.slug}/catalogue`);
  },

  delete: async ({ locals, params, request }) => {
    const { workspace } = await requireWorkspace(locals, { slug: params.workspace }, 'engineer');
    const id = entryId(await request.formData());
    if (!(await catalogue.destroy(workspace.id, id))) error(404, 'That catalogue entry does not exist');
    redirect(303, `/w/${workspace.slug}/catalogue`);
  },

  import: async ({ locals, params, request }) => {
    const { workspace } = await requireWorkspace(locals, { slug: params.workspace }, 'engineer');
    const file = (await request.formData()).get('file');
    const refuse = (message: string) => fail(400, { action: 'import' as const, errors: { file: message }, rowErrors: [] });
    if (!(file instanceof File) || file.size === 0 || file.name === '') return refuse('Choose a CSV file to import');
    if (!/\.csv$/i.test(file.name) || !CSV_TYPES.has(file.type)) {
      return refuse(`"${file.name}" is not a CSV file (expected a .csv file of type text/csv)`);
    }
    if (file.size > CSV_MAX_BYTES) {
      return refuse(`The file is ${(file.size / 1024).toFixed(0)} KB; the limit is ${CSV_MAX_BYTES / 1024} KB`);
    }
    let text: string;
    try {
      text = new TextDecoder('utf-8', { fatal: true }).decode(await file.arrayBuffer());
    } catch {
      return refuse('The file is not UTF-8 text; save it as "CSV UTF-8" and try again');
    }
    const result = await catalogue.importCsv(workspace.id, text);
    if (!result.ok) {
      return fail(400, {
        action: 'import' as const,
        errors: { file: `Nothing was imported: ${result.errors.length} problem${result.errors.length === 1 ? '' : 's'} in ${file.name}` },
        rowErrors: result.errors
      });
    }
    redirect(303, `/w/${workspace.slug}/catalogue?imported=${result.imported}`);
  }
};
