import { useCallback, useState } from 'react';

/** The browser's storage key of a setting remembered for one design, e.g. its preview range. */
export function rememberedKey(kind: string, designId: number): string {
  return `quietglass.${kind}.design-${designId}`;
}

function readStored<T extends object>(key: string): T | null {
  try {
    const text = window.localStorage.getItem(key);
    if (!text) return null;
    const value: unknown = JSON.parse(text);
    return value && typeof value === 'object' ? (value as T) : null;
  } catch {
    return null;
  }
}

/**
 * A setting the engineer chose, remembered in this browser under `key` (null: not yet chosen, so
 * the caller shows its default). `forget` goes back to the default.
 */
export function useRemembered<T extends object>(key: string): [T | null, (value: T) => void, () => void] {
  const [value, setValue] = useState<T | null>(() => readStored<T>(key));
  const remember = useCallback(
    (next: T) => {
      setValue(next);
      try {
        window.localStorage.setItem(key, JSON.stringify(next));
      } catch {
        // Storage full or disabled: the setting lasts for this visit only.
      }
    },
    [key],
  );
  const forget = useCallback(() => {
    setValue(null);
    try {
      window.localStorage.removeItem(key);
    } catch {
      // Nothing stored.
    }
  }, [key]);
  return [value, remember, forget];
}
