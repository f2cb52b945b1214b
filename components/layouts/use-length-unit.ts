'use client';

import { useEffect, useState } from 'react';
import { isLengthUnit, type LengthUnit } from '@/lib/layouts/units';

const KEY = 'fishplate.lengthUnit';

/** The unit a planner types lengths in, remembered in this browser. Stored lengths are always mm. */
export function useLengthUnit(): [LengthUnit, (u: LengthUnit) => void] {
  const [unit, setUnit] = useState<LengthUnit>('mm');
  useEffect(() => {
    const saved = window.localStorage.getItem(KEY);
    if (isLengthUnit(saved)) setUnit(saved);
  }, []);
  return [
    unit,
    (u) => {
      setUnit(u);
      window.localStorage.setItem(KEY, u);
    },
  ];
}
