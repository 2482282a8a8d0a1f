'use client';
import { useEffect, useState } from 'react';
import { useListUrl } from './use-list-url';

/** A text kept in one URL parameter, written back 300 ms after the last keystroke. */
export function useUrlText(param: string) {
  const { searchParams, update } = useListUrl();
  const urlValue = searchParams.get(param) ?? '';
  const [value, setValue] = useState(urlValue);
  const [lastUrlValue, setLastUrlValue] = useState(urlValue);
  if (urlValue !== lastUrlValue) {
    setLastUrlValue(urlValue);
    setValue(urlValue);
  }

  useEffect(() => {
    if (value.trim() === urlValue) return;
    const t = setTimeout(() => update({ [param]: value.trim() }), 300);
    return () => clearTimeout(t);
  }, [value, urlValue, param, update]);

  return [value, setValue] as const;
}
