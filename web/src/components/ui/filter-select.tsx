/** A compact select for a list filter, its label beside it. */
export function FilterSelect({
  label,
  value,
  onChange,
  options,
  labelClassName = 'shrink-0',
}: {
  label: string;
  value: string;
  onChange: (value: string) => void;
  options: Array<{ value: string; label: string }>;
  /** Classes of the label's text, e.g. a fixed width so stacked filters line up on a phone. */
  labelClassName?: string;
}) {
  return (
    <label className="flex items-center gap-2 text-sm text-tide-800">
      <span className={labelClassName}>{label}</span>
      <select
        value={value}
        onChange={(e) => onChange(e.target.value)}
        className="min-h-10 w-full rounded-lg border border-tide-200 bg-white px-2 py-1.5 text-base sm:w-auto sm:text-sm"
      >
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    </label>
  );
}
