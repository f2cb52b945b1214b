'use client';

import { inputClass } from '@/components/ui/field';
import { LENGTH_UNIT_LABELS, LENGTH_UNITS, type LengthUnit } from '@/lib/layouts/units';

export function UnitPicker({ unit, onChange, id }: { unit: LengthUnit; onChange: (u: LengthUnit) => void; id: string }) {
  return (
    <label htmlFor={id} className="flex items-center gap-2 whitespace-nowrap text-sm text-muted">
      Lengths in
      <select id={id} value={unit} onChange={(e) => onChange(e.target.value as LengthUnit)} className={`${inputClass.replace('w-full ', '')} w-44`}>
        {LENGTH_UNITS.map((u) => (
          <option key={u} value={u}>
            {LENGTH_UNIT_LABELS[u]}
          </option>
        ))}
      </select>
    </label>
  );
}
