import { flexRender, type Header } from '@tanstack/react-table';

/** A table header cell; a sortable column's title is a button, its state in aria-sort. */
export function SortHeader<T>({ header, numeric = false }: { header: Header<T, unknown>; numeric?: boolean }) {
  const column = header.column;
  const content = flexRender(column.columnDef.header, header.getContext());
  const align = numeric ? 'text-right' : '';
  if (!column.getCanSort()) return <th className={`py-2 pr-3 font-medium ${align}`}>{content}</th>;
  const dir = column.getIsSorted();
  return (
    <th className={`py-2 pr-3 font-medium ${align}`} aria-sort={dir === 'asc' ? 'ascending' : dir === 'desc' ? 'descending' : 'none'}>
      <button
        type="button"
        onClick={column.getToggleSortingHandler()}
        className={`inline-flex items-center gap-1 uppercase tracking-wider hover:text-mist-100 ${dir ? 'text-mist-100' : ''}`}
      >
        {content}
        <span aria-hidden className={`font-mono ${dir ? 'text-accent' : 'text-ink-600'}`}>
          {dir === 'asc' ? '↑' : dir === 'desc' ? '↓' : '↕'}
        </span>
      </button>
    </th>
  );
}
