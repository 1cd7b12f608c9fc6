import { FormGroup, InputGroup } from '@blueprintjs/core';
import { type FormEvent, useEffect, useRef, useState } from 'react';
import { useDebouncedValue } from '../../../lib/use-debounced-value';

interface PatientSearchProps {
  /** The search in the URL. */
  value: string;
  /** Called ~250 ms after typing stops, or at once on Enter. */
  onSearch: (search: string) => void;
  busy: boolean;
}

export function PatientSearch({ value, onSearch, busy }: PatientSearchProps) {
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
  useEffect(() => latest.current(debounced.trim()), [debounced]);

  const onSubmit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    onSearch(text.trim());
  };

  return (
    <form role="search" onSubmit={onSubmit} className="patient-search">
      <FormGroup label="Search patients" labelFor="patient-search" helperText="Name or chart number">
        <InputGroup
          id="patient-search"
          data-testid="patient-search"
          type="search"
          leftIcon="search"
          placeholder="e.g. Novak or C-1042"
          value={text}
          onValueChange={setText}
          rightElement={busy ? <span className="patient-search__busy">Searching…</span> : undefined}
          autoComplete="off"
        />
      </FormGroup>
    </form>
  );
}
