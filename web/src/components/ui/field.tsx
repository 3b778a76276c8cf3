import type { InputHTMLAttributes, ReactNode, SelectHTMLAttributes, TextareaHTMLAttributes } from 'react';

/** 16 px text on phones so the browser does not zoom into a field; 14 px from `sm` up. */
export const inputClass =
  'block w-full rounded-lg border border-tide-200 bg-white px-3 py-2 text-base text-tide-950 shadow-sm placeholder:text-tide-400 focus:border-tide-600 focus:outline-none focus:ring-2 focus:ring-spark-400/60 disabled:bg-tide-50 disabled:text-tide-600 aria-invalid:border-eol-600 aria-invalid:ring-eol-600/20 sm:text-sm';

/**
 * A labelled form field with an optional hint and its own error message, tied to the
 * control by id for screen readers.
 */
export function Field({
  id,
  label,
  hint,
  error,
  required,
  children,
  className = '',
}: {
  id: string;
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
  required?: boolean;
  children: ReactNode;
  className?: string;
}) {
  return (
    <div className={className}>
      <label htmlFor={id} className="mb-1 block text-sm font-medium text-tide-900">
        {label}
        {required ? (
          <span className="ml-0.5 text-eol-600" aria-hidden="true">
            *
          </span>
        ) : null}
      </label>
      {children}
      {error ? (
        <p id={`${id}-error`} className="mt-1 text-sm font-medium text-eol-600" data-testid={`error-${id}`}>
          {error}
        </p>
      ) : hint ? (
        <p id={`${id}-hint`} className="mt-1 text-xs text-tide-600">
          {hint}
        </p>
      ) : null}
    </div>
  );
}

type Invalid = { invalid?: boolean };

/** Props that tie a control to its Field's message. */
function described(id: string | undefined, invalid: boolean | undefined) {
  return id ? { 'aria-invalid': invalid || undefined, 'aria-describedby': invalid ? `${id}-error` : `${id}-hint` } : {};
}

export function TextInput({ invalid, className = '', ...props }: InputHTMLAttributes<HTMLInputElement> & Invalid) {
  return <input className={`${inputClass} ${className}`} {...described(props.id, invalid)} {...props} />;
}

export function TextArea({ invalid, className = '', ...props }: TextareaHTMLAttributes<HTMLTextAreaElement> & Invalid) {
  return <textarea rows={3} className={`${inputClass} ${className}`} {...described(props.id, invalid)} {...props} />;
}

export function Select({ invalid, className = '', ...props }: SelectHTMLAttributes<HTMLSelectElement> & Invalid) {
  return <select className={`${inputClass} pr-8 ${className}`} {...described(props.id, invalid)} {...props} />;
}

/** A field with a unit after the number, e.g. "V" or "µF". */
export function UnitInput({ unit, invalid, className = '', ...props }: InputHTMLAttributes<HTMLInputElement> & Invalid & { unit: string }) {
  return (
    <div className="relative">
      <input className={`${inputClass} pr-12 ${className}`} inputMode="decimal" {...described(props.id, invalid)} {...props} />
      <span className="pointer-events-none absolute inset-y-0 right-3 flex items-center text-sm text-tide-600">{unit}</span>
    </div>
  );
}
