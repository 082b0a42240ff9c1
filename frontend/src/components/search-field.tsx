import { useEffect, useRef, useState } from 'react';
import { TextField } from './form-field';

/**
 * A search box that asks the server only after typing pauses (300 ms), so each keystroke does
 * not send a request. Escape clears it. `value` follows the address when it changes elsewhere
 * (back button).
 */
export function SearchField({
  label,
  value,
  onSearch,
  className = 'min-w-56 flex-1',
  hint,
}: {
  label: string;
  value: string;
  onSearch: (text: string) => void;
  className?: string;
  hint?: string;
}) {
  const [text, setText] = useState(value);
  const latest = useRef(onSearch);
  latest.current = onSearch;

  useEffect(() => setText(value), [value]);

  useEffect(() => {
    if (text === value) return;
    const timer = window.setTimeout(() => latest.current(text), 300);
    return () => window.clearTimeout(timer);
  }, [text, value]);

  return (
    <TextField
      label={label}
      type="search"
      className={className}
      hint={hint}
      value={text}
      onChange={(event) => setText(event.target.value)}
      onKeyDown={(event) => {
        if (event.key === 'Escape' && text !== '') {
          event.preventDefault();
          setText('');
          latest.current('');
        }
      }}
    />
  );
}
