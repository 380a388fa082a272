import { useEffect, useState } from 'react';

/**
 * `on`, once it has been true for `delayMs` without a break; false at once when it turns false. A state that
 * usually passes in a moment (a quick build) then shows no flicker, and one that lasts is still shown.
 */
export function useDelayedFlag(on: boolean, delayMs: number): boolean {
  const [late, setLate] = useState(false);
  useEffect(() => {
    if (!on) {
      setLate(false);
      return;
    }
    const timer = setTimeout(() => setLate(true), delayMs);
    return () => clearTimeout(timer);
  }, [on, delayMs]);
  return on && late;
}
