// @vitest-environment node
/**
 * The office table's CSV export with paging: the file holds every row the filters leave, in the
 * table's order, not only the page on screen. Built on TanStack Table's own row models.
 */
import { createTable, getCoreRowModel, getPaginationRowModel, getSortedRowModel, type TableOptionsResolved } from '@tanstack/react-table';
import { describe, expect, it } from 'vitest';
import { tableToCsv } from '../../src/components/DataTable';

type Row = { n: number; name: string };
const data: Row[] = Array.from({ length: 120 }, (_, i) => ({ n: i + 1, name: `unit ${i + 1}` }));

function table(pageIndex: number) {
  const options: TableOptionsResolved<Row> = {
    data,
    columns: [
      { accessorKey: 'n', header: 'No.' },
      { accessorKey: 'name', header: 'Name' },
    ],
    state: { pagination: { pageIndex, pageSize: 50 }, sorting: [{ id: 'n', desc: true }], columnPinning: {}, columnVisibility: {}, columnOrder: [] },
    onStateChange: () => {},
    renderFallbackValue: null,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getPaginationRowModel: getPaginationRowModel(),
  };
  return createTable(options);
}

describe('tableToCsv with pages', () => {
  it('shows 50 rows a page but exports all 120, sorted as shown', () => {
    const second = table(1);
    expect(second.getRowModel().rows.map((r) => r.original.n)).toEqual(data.slice(20, 70).map((d) => d.n).reverse());
    const lines = tableToCsv(second).trim().split(/\r?\n/);
    expect(lines).toHaveLength(121);
    expect(lines[0]).toBe('No.,Name');
    expect(lines[1]).toBe('120,unit 120');
    expect(lines[120]).toBe('1,unit 1');
  });
});
