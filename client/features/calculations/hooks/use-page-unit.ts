import { useCallback, useState } from 'react';
import type { LengthUnit } from '@shared/calc';

const STORAGE_KEY = 'tenthmark.calculator.unit';

function storedUnit(): LengthUnit {
  try {
    return window.localStorage.getItem(STORAGE_KEY) === 'mm' ? 'mm' : 'in';
  } catch {
    return 'in';
  }
}

/** The calculator page's one length unit, remembered in this browser between visits. */
export function usePageUnit(): [LengthUnit, (unit: LengthUnit) => void] {
  const [unit, setUnitState] = useState<LengthUnit>(storedUnit);
  const setUnit = useCallback((next: LengthUnit) => {
    setUnitState(next);
    try {
      window.localStorage.setItem(STORAGE_KEY, next);
    } catch {
      // Private windows may refuse storage; the switch still works for this visit.
    }
  }, []);
  return [unit, setUnit];
}
