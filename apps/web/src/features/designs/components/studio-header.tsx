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

/** Reasons that pass by themselves in a moment (the model is on its way): not worth a line on the page. */
export const REQUEST_WAITS_FOR_PREVIEW = 'The preview is not ready yet';
export const REQUEST_WAITS_FOR_FIT = 'Wait until the size is fitted to the sheets';
const PASSING_REASONS: readonly string[] = [REQUEST_WAITS_FOR_PREVIEW, REQUEST_WAITS_FOR_FIT];

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
    <Stack
      direction={{ xs: 'column', md: 'row' }}
      spacing={2}
      sx={{ mb: 2, alignItems: { md: 'flex-start' } }}
    >
      <Box sx={{ flex: 1 }}>
        <Typography variant="h1">Design studio</Typography>
        <Typography color="text.secondary">
          {design ? `${design.name} · version ${design.version} · by ${design.ownerName}` : 'A new design'}
        </Typography>
      </Box>
      {/* The actions, and under them why one is disabled: beside the button it explains at every width (under
          the title it sat a screen away from the button on a phone, where the actions stack). */}
      <Box sx={{ display: 'flex', flexDirection: 'column', gap: 1, alignItems: { md: 'flex-end' } }}>
        <Stack direction={{ xs: 'column', md: 'row' }} spacing={2} sx={{ alignItems: { md: 'center' } }}>
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
        {/* Said on the page, not only in the tooltips: a disabled button takes no focus, so a keyboard or
            screen reader never meets its tooltip, and a phone has no hover. */}
        {canSave ? null : (
          <Typography
            variant="body2"
            color="text.secondary"
            data-testid="save-not-yours"
            sx={{ textAlign: { md: 'right' }, maxWidth: { md: '40rem' } }}
          >
            {SAVE_NOT_YOURS}
          </Typography>
        )}
        {/* Why "Request a cut job" is disabled. Its line is kept while empty, so the page does not jump when
            the first edit makes it appear. */}
        {design ? (
          <Typography
            variant="body2"
            color="text.secondary"
            data-testid="request-blocked"
            sx={{ minHeight: '1.43em', textAlign: { md: 'right' }, maxWidth: { md: '40rem' } }}
          >
            {requestBlocked !== null && !PASSING_REASONS.includes(requestBlocked)
              ? `A cut job cannot be requested yet. ${requestBlocked}.`
              : null}
          </Typography>
        ) : null}
      </Box>
    </Stack>
  );
});
