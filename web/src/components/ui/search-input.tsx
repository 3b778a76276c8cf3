import { useEffect, useState } from 'react';
import { inputClass } from './field';

/** A search box that reports what was typed once typing pauses (300 ms), not on every key. */
export function SearchInput({
  value,
  onSearch,
  label,
  placeholder,
}: {
  value: string;
  onSearch: (q: string) => void;
  label: string;
  placeholder: string;
}) {
  const [text, setText] = useState(value);
  // the address bar changed the search (Back, a link): show what it says now
  const [shown, setShown] = useState(value);
  if (shown !== value) {
    setShown(value);
    setText(value);
  }
  useEffect(() => {
    if (text === value) return;
    const timer = setTimeout(() => onSearch(text.trim()), 300);
    return () => clearTimeout(timer);
  }, [text, value, onSearch]);
  return (
    <label className="block w-full sm:max-w-xs">
      <span className="sr-only">{label}</span>
      <input
        type="search"
        value={text}
        onChange={(e) => setText(e.target.value)}
        placeholder={placeholder}
        className={inputClass}
        autoCapitalize="characters"
        autoCorrect="off"
        spellCheck={false}
      />
    </label>
  );
}
