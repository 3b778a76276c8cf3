import type { ReactNode } from 'react';

export interface Detail {
  label: ReactNode;
  /** A key when the label is not a string. */
  id?: string;
  value: ReactNode;
  /** Spans both columns on wide screens. */
  wide?: boolean;
}

/** Label and value pairs of a record, two columns on wide screens, one on phones. */
export function DetailList({ items }: { items: Detail[] }) {
  return (
    <dl className="grid grid-cols-2 gap-x-6 gap-y-3">
      {items.map((item) => (
        <div key={item.id ?? String(item.label)} className={item.wide ? 'col-span-2' : ''}>
          <dt className="text-xs font-bold uppercase tracking-wide text-tide-600">{item.label}</dt>
          <dd className="mt-0.5 break-words text-tide-950">{item.value === '' || item.value == null ? <span className="text-tide-400">—</span> : item.value}</dd>
        </div>
      ))}
    </dl>
  );
}
