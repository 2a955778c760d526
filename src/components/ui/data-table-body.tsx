import { useWindowVirtualizer } from '@tanstack/react-virtual';
import { useLayoutEffect, useRef, useState, type Ref } from 'react';
import type { Column } from './data-table';

export interface BodyProps<T> {
  columns: Column<T>[];
  rows: readonly T[];
  rowKey: (row: T) => string;
  rowClassName?: (row: T) => string;
}

function Row<T>({ row, columns, className, index, rowRef }: { row: T; columns: Column<T>[]; className: string; index?: number; rowRef?: Ref<HTMLTableRowElement> }) {
  return (
    <tr ref={rowRef} data-index={index} className={`border-t border-line hover:bg-raised/60 ${className}`}>
      {columns.map((c) => (
        <td key={c.key} className={`whitespace-nowrap px-3 py-3 align-middle ${c.align === 'right' ? 'text-right' : ''} ${c.className ?? ''}`}>
          {c.cell(row)}
        </td>
      ))}
    </tr>
  );
}

export function PlainBody<T>({ columns, rows, rowKey, rowClassName }: BodyProps<T>) {
  return (
    <tbody className="bg-panel">
      {rows.map((row) => (
        <Row key={rowKey(row)} row={row} columns={columns} className={rowClassName?.(row) ?? ''} />
      ))}
    </tbody>
  );
}

/** Only the rows near the window's viewport are rendered; spacer rows keep the scroll height true. */
export function VirtualBody<T>({ columns, rows, rowKey, rowClassName }: BodyProps<T>) {
  const ref = useRef<HTMLTableSectionElement>(null);
  const [margin, setMargin] = useState(0);
  useLayoutEffect(() => {
    const measure = () => ref.current && setMargin(ref.current.getBoundingClientRect().top + window.scrollY);
    measure();
    window.addEventListener('resize', measure);
    return () => window.removeEventListener('resize', measure);
  }, [rows.length]);

  const v = useWindowVirtualizer({ count: rows.length, estimateSize: () => 57, overscan: 12, scrollMargin: margin, getItemKey: (i) => rowKey(rows[i]) });
  const items = v.getVirtualItems();
  const top = items.length ? items[0].start - margin : 0;
  const bottom = items.length ? v.getTotalSize() - (items[items.length - 1].end - margin) : 0;
  const span = columns.length;
  return (
    <tbody ref={ref} className="bg-panel">
      {top > 0 && (
        <tr aria-hidden="true">
          <td colSpan={span} style={{ height: top, padding: 0 }} />
        </tr>
      )}
      {items.map((item) => {
        const row = rows[item.index];
        return (
          <Row key={item.key} index={item.index} rowRef={v.measureElement} row={row} columns={columns} className={rowClassName?.(row) ?? ''} />
        );
      })}
      {bottom > 0 && (
        <tr aria-hidden="true">
          <td colSpan={span} style={{ height: bottom, padding: 0 }} />
        </tr>
      )}
    </tbody>
  );
}
