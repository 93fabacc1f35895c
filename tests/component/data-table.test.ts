/**
 * DataTable on @tanstack/table-core v9: it lays out the page it is given and reports sort and
 * page changes to its parent (server-side sort and paging), numbers right-aligned.
 */
import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, render, screen, within } from '@testing-library/svelte';

afterEach(cleanup);
import DataTable from '../../src/lib/components/DataTable.svelte';

type Row = { id: number; name: string; glow: number };
const rows: Row[] = [
  { id: 3, name: 'three', glow: 12000 },
  { id: 7, name: 'seven', glow: 9000 }
];
const columns = [
  { id: 'id', header: 'Case', value: (r: Row) => r.id, numeric: true, sortable: true },
  { id: 'name', header: 'Name', value: (r: Row) => r.name },
  { id: 'glow', header: 'GLOW (kg)', value: (r: Row) => r.glow, format: (r: Row) => r.glow.toLocaleString('en-US'), numeric: true, sortable: true, firstDir: 'desc' as const }
];

function setup(extra: Record<string, unknown> = {}) {
  const onSort = vi.fn();
  const onPage = vi.fn();
  render(DataTable, {
    props: { columns, rows, rowKey: (r: Row) => r.id, total: 60, pageIndex: 0, pageSize: 25, sort: { id: 'id', dir: 'asc' }, label: 'Results', onSort, onPage, ...extra }
  } as never);
  return { onSort, onPage };
}

describe('DataTable', () => {
  it('renders the given rows with formatted, right-aligned numbers and the sort state in aria-sort', () => {
    setup();
    const table = screen.getByRole('table', { name: 'Results' });
    const bodyRows = within(table).getAllByRole('row').slice(1);
    expect(bodyRows).toHaveLength(2);
    const cells = within(bodyRows[0]).getAllByRole('cell');
    expect(cells.map((c) => c.textContent?.trim())).toEqual(['3', 'three', '12,000']);
    expect(cells[2].className).toContain('num');
    expect(cells[1].className).not.toContain('num');
    expect(screen.getByRole('columnheader', { name: /Case/ }).getAttribute('aria-sort')).toBe('ascending');
    expect(screen.getByRole('columnheader', { name: /GLOW/ }).getAttribute('aria-sort')).toBeNull();
    expect(screen.getByText(/Rows 1–25 of\s+60/)).toBeTruthy();
    expect(screen.getByText('Page 1 of 3')).toBeTruthy();
  });

  it('reports sorting: same column flips the direction, a new column starts at its first direction', async () => {
    const { onSort } = setup();
    await fireEvent.click(screen.getByRole('button', { name: /Case/ }));
    expect(onSort).toHaveBeenLastCalledWith('id', 'desc');
    await fireEvent.click(screen.getByRole('button', { name: /GLOW/ }));
    expect(onSort).toHaveBeenLastCalledWith('glow', 'desc');
    // A column that is not sortable has no button.
    expect(screen.queryByRole('button', { name: 'Name' })).toBeNull();
  });

  it('reports paging and disables the ends', async () => {
    const { onPage } = setup({ pageIndex: 2 });
    expect((screen.getByRole('button', { name: 'Next' }) as HTMLButtonElement).disabled).toBe(true);
    await fireEvent.click(screen.getByRole('button', { name: 'Previous' }));
    expect(onPage).toHaveBeenLastCalledWith(1);
  });

  it('shows the empty message when there are no rows', () => {
    setup({ rows: [], total: 0, empty: 'No case matches these filters.' });
    expect(screen.getByText('No case matches these filters.')).toBeTruthy();
    expect(screen.getByText('No rows')).toBeTruthy();
  });
});

describe('DataTable column filters (table-core columnFilters state)', () => {
  const filterColumns = [
    { id: 'id', header: 'Case', value: (r: Row) => r.id, numeric: true },
    { id: 'name', header: 'Name', value: (r: Row) => r.name, filter: { kind: 'choice' as const, options: [{ value: 'three', label: 'Three' }, { value: 'seven', label: 'Seven' }] } },
    { id: 'glow', header: 'GLOW (kg)', value: (r: Row) => r.glow, numeric: true, filter: { kind: 'range' as const } }
  ];
  function withFilters(extra: Record<string, unknown> = {}) {
    const onFilter = vi.fn();
    render(DataTable, {
      props: { columns: filterColumns, rows, rowKey: (r: Row) => r.id, total: 2, pageIndex: 0, pageSize: 25, sort: null, label: 'Results', onSort: vi.fn(), onPage: vi.fn(), onFilter, ...extra }
    } as never);
    return onFilter;
  }

  it('reports a typed range end as the column filter value; clearing both ends removes the filter', async () => {
    const onFilter = withFilters();
    await fireEvent.input(screen.getByLabelText('GLOW (kg) from'), { target: { value: '10,000' } });
    expect(onFilter).toHaveBeenLastCalledWith([{ id: 'glow', value: { min: '10,000', max: '' } }]);
    cleanup();
    const again = withFilters({ filters: [{ id: 'glow', value: { min: '10,000', max: '' } }] });
    expect((screen.getByLabelText('GLOW (kg) from') as HTMLInputElement).value).toBe('10,000');
    await fireEvent.input(screen.getByLabelText('GLOW (kg) from'), { target: { value: '' } });
    expect(again).toHaveBeenLastCalledWith([]);
  });

  it('reports a choice, shows the error of a column beside its inputs, and clears all filters', async () => {
    const onFilter = withFilters({ filters: [{ id: 'glow', value: { min: 'x', max: '' } }], filterErrors: { glow: 'GLOW (kg) from must be a number' } });
    const from = screen.getByLabelText('GLOW (kg) from');
    expect(from.getAttribute('aria-invalid')).toBe('true');
    expect(document.getElementById(from.getAttribute('aria-describedby')!)?.textContent).toBe('GLOW (kg) from must be a number');
    await fireEvent.change(screen.getByLabelText('Name filter'), { target: { value: 'seven' } });
    expect(onFilter).toHaveBeenLastCalledWith([{ id: 'glow', value: { min: 'x', max: '' } }, { id: 'name', value: 'seven' }]);
    await fireEvent.click(screen.getByRole('button', { name: 'Clear filters' }));
    expect(onFilter).toHaveBeenLastCalledWith([]);
  });

  it('has no filter row without an onFilter handler', () => {
    setup();
    expect(screen.queryByTestId('filter-row')).toBeNull();
  });
});
