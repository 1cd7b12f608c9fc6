import { FormGroup, InputGroup } from '@blueprintjs/core';
import { type FormEvent, useEffect, useRef, useState } from 'react';
import { useDebouncedValue } from '../use-debounced-value';
import './live-search.css';

interface LiveSearchProps {
  id: string;
  label: string;
  helperText?: string;
  placeholder?: string;
  /** The search in the URL. */
  value: string;
  /** Called ~250 ms after typing stops, or at once on Enter. */
  onSearch: (search: string) => void;
  busy: boolean;
}

/**
 * The one search box of the lists (Patients, Recall desk): it filters as the user types, and
 * Enter searches at once. The search lives in the page's URL, so it survives reload and Back.
 */
export function LiveSearch({ id, label, helperText, placeholder, value, onSearch, busy }: LiveSearchProps) {
  const [text, setText] = useState(value);
  const debounced = useDebouncedValue(text, 250);
  const latest = useRef(onSearch);
  useEffect(() => {
    latest.current = onSearch;
  });

  // Follow the URL when it changes from outside (back/forward): adjusted while rendering, as
  // React advises for state derived from a prop, rather than in an effect.
  const [urlValue, setUrlValue] = useState(value);
  if (value !== urlValue) {
    setUrlValue(value);
    if (text.trim() !== value) setText(value);
  }
  useEffect(() => {
    latest.current(debounced.trim());
  }, [debounced]);

  const onSubmit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    onSearch(text.trim());
  };

  return (
    <form role="search" onSubmit={onSubmit} className="live-search">
      <FormGroup label={label} labelFor={id} helperText={helperText}>
        <InputGroup
          id={id}
          data-testid={id}
          type="search"
          leftIcon="search"
          placeholder={placeholder}
          value={text}
          onValueChange={setText}
          rightElement={busy ? <span className="live-search__busy">Searching…</span> : undefined}
          autoComplete="off"
        />
      </FormGroup>
    </form>
  );
}
