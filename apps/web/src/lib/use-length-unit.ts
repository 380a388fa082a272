/**
 * The unit this browser shows lengths in, kept in localStorage: a workshop that works in inches chooses it
 * once, and the studio, the job pages and a reload follow (other tabs too, through the storage event).
 * Millimetres until chosen, and whenever storage is blocked.
 */
import { useSyncExternalStore } from 'react';
import { type LengthUnit } from './units';

export const LENGTH_UNIT_STORAGE_KEY = 'kerfwright.lengthUnit';

const listeners = new Set<() => void>();

function read(): LengthUnit {
  try {
    return window.localStorage.getItem(LENGTH_UNIT_STORAGE_KEY) === 'in' ? 'in' : 'mm';
  } catch {
    return 'mm';
  }
}

function subscribe(listener: () => void): () => void {
  listeners.add(listener);
  const onStorage = (event: StorageEvent) => {
    if (event.key === null || event.key === LENGTH_UNIT_STORAGE_KEY) listener();
  };
  window.addEventListener('storage', onStorage);
  return () => {
    listeners.delete(listener);
    window.removeEventListener('storage', onStorage);
  };
}

export function setLengthUnit(unit: LengthUnit): void {
  try {
    window.localStorage.setItem(LENGTH_UNIT_STORAGE_KEY, unit);
  } catch {
    // Storage blocked: the choice cannot be kept, and the pages stay in millimetres.
  }
  for (const listener of [...listeners]) listener();
}

/** The unit lengths are shown and typed in, and the way to change it everywhere. */
export function useLengthUnit(): [LengthUnit, (unit: LengthUnit) => void] {
  return [useSyncExternalStore(subscribe, read, () => 'mm' as const), setLengthUnit];
}
