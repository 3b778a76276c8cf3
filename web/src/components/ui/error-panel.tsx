import type { ReactNode } from 'react';

/** A failure said in plain words, with an optional way out. */
export function ErrorPanel({ title, children, action }: { title: string; children?: ReactNode; action?: ReactNode }) {
  return (
    <div role="alert" className="rounded-xl border border-eol-600/30 bg-white p-5 shadow-sm">
      <p className="font-bold text-eol-600">{title}</p>
      {children ? <div className="mt-1 text-sm text-tide-800">{children}</div> : null}
      {action ? <div className="mt-4">{action}</div> : null}
    </div>
  );
}
