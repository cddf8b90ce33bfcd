import { Search } from 'lucide-react';
import { useEffect, useId, useRef, useState } from 'react';
import { controlClasses } from './field';

interface SearchFieldProps {
  label: string;
  value: string;
  /** Called a moment after typing stops, so the address and the server are not asked on every key. */
  onSearch: (value: string) => void;
  placeholder?: string;
  delayMs?: number;
}

export function SearchField({ label, value, onSearch, placeholder, delayMs = 300 }: SearchFieldProps) {
  const id = useId();
  const [text, setText] = useState(value);
  const latestOnSearch = useRef(onSearch);
  useEffect(() => {
    latestOnSearch.current = onSearch;
  });

  // A new value from outside (back button, a cleared filter) replaces what is typed.
  useEffect(() => setText(value), [value]);

  useEffect(() => {
    if (text.trim() === value.trim()) return;
    const timer = setTimeout(() => latestOnSearch.current(text.trim()), delayMs);
    return () => clearTimeout(timer);
  }, [text, value, delayMs]);

  return (
    <div className="space-y-1.5">
      <label htmlFor={id} className="block font-medium">
        {label}
      </label>
      <div className="relative">
        <Search className="pointer-events-none absolute top-1/2 left-3 size-5 -translate-y-1/2 text-grey-500" aria-hidden="true" />
        <input
          id={id}
          type="search"
          value={text}
          placeholder={placeholder}
          onChange={(event) => setText(event.target.value)}
          className={controlClasses(false, 'pl-10')}
          autoComplete="off"
          spellCheck={false}
        />
      </div>
    </div>
  );
}
