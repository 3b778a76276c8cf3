import { useEffect, useId, useRef, type ReactNode } from 'react';

/** How wide the dialog may grow from a small screen up; on a phone it always fills the width. */
const WIDTH_CLASS = {
  medium: 'sm:max-w-lg',
  large: 'sm:max-w-xl',
  wide: 'sm:max-w-3xl',
} as const;

export type ModalWidth = keyof typeof WIDTH_CLASS;

/**
 * A dialog over the page: the browser's modal `<dialog>` (focus kept inside, Escape closes),
 * named by its title, with a close button in its sticky header. On a phone it fills the width and
 * scrolls inside.
 *
 * - `wide` — the wide width (same as `width="wide"`); `width` picks another one.
 * - `tall` — may take a little more of the screen's height.
 * - `bodyClassName` — extra classes for the body around the children (e.g. spacing).
 */
export function Modal({
  title,
  onClose,
  children,
  wide = false,
  width,
  tall = false,
  bodyClassName,
}: {
  title: string;
  onClose: () => void;
  children: ReactNode;
  wide?: boolean;
  width?: ModalWidth;
  tall?: boolean;
  bodyClassName?: string;
}) {
  const ref = useRef<HTMLDialogElement>(null);
  const titleId = useId();
  useEffect(() => {
    const dialog = ref.current;
    if (dialog && !dialog.open) dialog.showModal();
    return () => dialog?.close();
  }, []);
  const widthClass = WIDTH_CLASS[width ?? (wide ? 'wide' : 'medium')];
  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      onCancel={(event) => {
        event.preventDefault();
        onClose();
      }}
      className={`m-auto ${tall ? 'max-h-[94dvh]' : 'max-h-[92dvh]'} w-[calc(100%-1rem)] overflow-y-auto rounded-xl border border-tide-100 bg-white p-0 text-tide-950 shadow-xl backdrop:bg-tide-950/40 ${widthClass}`}
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
      <div className={bodyClassName ? `${bodyClassName} px-4 py-4` : 'px-4 py-4'}>{children}</div>
    </dialog>
  );
}
