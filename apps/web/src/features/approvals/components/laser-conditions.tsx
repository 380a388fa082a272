import { isLaserKind, type MachineProfileSummaryView } from '@kerfwright/contracts';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';

/**
 * The waiting version's materials that a laser may cut only on a condition (the hazard table's: felt of known
 * fibre without adhesive, an unlisted material whose data sheet a supervisor read), with the condition.
 */
export function laserConditionsOf(p: MachineProfileSummaryView): { material: string; condition: string }[] {
  if (!isLaserKind(p.kind)) return [];
  return p.latest.settings.flatMap((s) =>
    s.laserCondition
      ? [{ material: s.materialName || 'A removed material', condition: s.laserCondition }]
      : [],
  );
}

/** Says which materials are cut only on a condition: approving the version confirms each was checked. */
export function LaserConditions({ conditions }: { conditions: { material: string; condition: string }[] }) {
  if (conditions.length === 0) return null;
  return (
    <Alert severity="warning" sx={{ mt: 2 }} data-testid="laser-conditions">
      A laser cuts {conditions.length === 1 ? 'this material' : 'these materials'} only on a condition;
      approving confirms that each was checked:
      <Box component="ul" sx={{ my: 0.5, pl: 2.5 }}>
        {conditions.map((c) => (
          <li key={c.material}>
            <strong>{c.material}</strong>: {c.condition}
          </li>
        ))}
      </Box>
    </Alert>
  );
}
