import { type DesignView } from '@kerfwright/contracts';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Stack from '@mui/material/Stack';
import Tooltip from '@mui/material/Tooltip';
import Typography from '@mui/material/Typography';
import { memo, type Ref } from 'react';
import { UnitToggle } from '../../../components/ui/unit-toggle';
import { type LengthUnit } from '../../../lib/units';

interface StudioHeaderProps {
  design: DesignView | null;
  unit: LengthUnit;
  onUnit: (unit: LengthUnit) => void;
  onSave: () => void;
  saving: boolean;
  /** The Save button, for the studio to put the keyboard back on it once a save is done. */
  saveRef?: Ref<HTMLButtonElement>;
  onDuplicate: () => void;
  duplicating: boolean;
  onRequest: () => void;
  /** Why a cut job cannot be requested now (unsaved changes, errors), in words, or null when it can. */
  requestBlocked: string | null;
  /** The owner or a supervisor saves the design; others may try changes and duplicate it (the API agrees). */
  canSave: boolean;
}

const SAVE_NOT_YOURS = 'Only its owner or a supervisor saves this design: duplicate it to keep your changes.';

/** The studio's title, unit switch and actions. Memoised: typing in the form leaves it alone. */
export const StudioHeader = memo(function StudioHeader({
  design,
  unit,
  onUnit,
  onSave,
  saving,
  saveRef,
  onDuplicate,
  duplicating,
  onRequest,
  requestBlocked,
  canSave,
}: StudioHeaderProps) {
  return (
    <Stack direction={{ xs: 'column', md: 'row' }} spacing={2} sx={{ mb: 2, alignItems: { md: 'center' } }}>
      <Box sx={{ flex: 1 }}>
        <Typography variant="h1">Design studio</Typography>
        <Typography color="text.secondary">
          {design ? `${design.name} · version ${design.version} · by ${design.ownerName}` : 'A new design'}
        </Typography>
        {/* Said on the page, not only in the tooltip: a disabled button takes no focus, so a keyboard or
            screen reader never meets the tooltip. */}
        {canSave ? null : (
          <Typography variant="body2" color="text.secondary" data-testid="save-not-yours">
            {SAVE_NOT_YOURS}
          </Typography>
        )}
      </Box>
      <UnitToggle unit={unit} onUnit={onUnit} />
      <Tooltip title={canSave ? '' : SAVE_NOT_YOURS} describeChild>
        <Box component="span" sx={{ display: 'inline-flex' }} data-testid="save-wrapper">
          <Button
            ref={saveRef}
            variant="contained"
            onClick={onSave}
            disabled={saving || !canSave}
            sx={{ flex: 1 }}
          >
            {design ? 'Save' : 'Save design'}
          </Button>
        </Box>
      </Tooltip>
      {design ? (
        <>
          <Button variant="outlined" onClick={onDuplicate} disabled={duplicating}>
            Duplicate
          </Button>
          {/* A disabled button takes no pointer events: the reason's tooltip sits on a wrapper. */}
          <Tooltip title={requestBlocked ?? ''} describeChild>
            <Box component="span" sx={{ display: 'inline-flex' }} data-testid="request-job-wrapper">
              <Button
                variant="outlined"
                color="secondary"
                disabled={requestBlocked !== null}
                onClick={onRequest}
                sx={{ flex: 1 }}
              >
                Request a cut job
              </Button>
            </Box>
          </Tooltip>
        </>
      ) : null}
    </Stack>
  );
});
