import ToggleButton from '@mui/material/ToggleButton';
import ToggleButtonGroup from '@mui/material/ToggleButtonGroup';
import { type LengthUnit } from '../../lib/units';

/** Millimetres or inches for the lengths on a page. */
export function UnitToggle({ unit, onUnit }: { unit: LengthUnit; onUnit: (unit: LengthUnit) => void }) {
  return (
    <ToggleButtonGroup
      size="small"
      exclusive
      value={unit}
      onChange={(_, u: LengthUnit | null) => u && onUnit(u)}
      aria-label="Units"
    >
      <ToggleButton value="mm">mm</ToggleButton>
      <ToggleButton value="in">inch</ToggleButton>
    </ToggleButtonGroup>
  );
}
