import { useEffect, useId, useRef, type ReactNode } from 'react';

/**
 * A dialog for a shutdown window: the browser's modal `<dialog>` (focus kept inside, Escape
 * closes). On a phone it fills the width and scrolls inside.
 */
export function WindowModal({ title, onClose, children }: { title: string; onClose: () => void; children: ReactNode }) {
  const ref = useRef<HTMLDialogElement>(null);
  const titleId = useId();
  useEffect(() => {
    const dialog = ref.current;
    if (dialog && !dialog.open) dialog.showModal();
    return () => dialog?.close();
  }, []);
  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      onCancel={(event) => {
        event.preventDefault();
        onClose();
      }}
      className="m-auto max-h-[92dvh] w-[calc(100%-1rem)] overflow-y-auto rounded-xl border border-tide-100 bg-white p-0 text-tide-950 shadow-xl backdrop:bg-tide-950/40 sm:max-w-xl"
    >
      <div className="sticky top-0 z-10 flex items-start justify-between gap-3 border-b border-tide-100 bg-white px-4 py-3">
        <h2 id={titleId} className="text-lg font-bold text-tide-900">
          {title}
        </h2>
        <button
          type="button"
          onClick={onClose}
          aria-label="Close"
          className="-m-1 inline-flex min-h-10 min-w-10 items-center justify-center rounded-lg text-xl text-tide-600 hover:bg-tide-50"
        >
          ×
        </button>
      </div>
      <div className="px-4 py-4">{children}</div>
    </dialog>
  );
}
