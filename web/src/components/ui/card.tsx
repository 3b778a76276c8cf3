import type { ReactNode } from 'react';

export function Card({ title, children, className = '' }: { title?: ReactNode; children: ReactNode; className?: string }) {
  return (
    <section className={`rounded-xl border border-tide-100 bg-white p-5 shadow-sm ${className}`}>
      {title ? <h2 className="mb-3 text-sm font-bold uppercase tracking-wide text-tide-600">{title}</h2> : null}
      {children}
    </section>
  );
}
