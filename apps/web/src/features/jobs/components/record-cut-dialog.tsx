import { zodResolver } from '@hookform/resolvers/zod';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Checkbox from '@mui/material/Checkbox';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import FormControlLabel from '@mui/material/FormControlLabel';
import Stack from '@mui/material/Stack';
import { useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { FormErrorAlert } from '../../../components/ui/form-error-alert';
import { FormTextField } from '../../../components/ui/form-text-field';
import { LengthField } from '../../../components/ui/length-field';
import { FOCUS_FIRST_FIELD_ON_OPEN } from '../../../components/ui/focus-first-field';
import { countOf } from '../../../lib/plural';
import { KERF_INCH_DECIMALS, type LengthUnit } from '../../../lib/units';
import { isFarAboveSheets, type RecordCutValues, recordCutSchemaFor } from './job-action-schemas';

/**
 * The operator records what the cut took: machine time, sheets and (optionally) the kerf measured on it. A
 * sheet count far above the prepared one (999 for a job of 3 sheets) is recorded only once confirmed.
 */
export function RecordCutDialog(props: {
  open: boolean;
  busy: boolean;
  error: unknown;
  /** The sheets the preparation laid out (the count offered), or null when unknown. */
  preparedSheets: number | null;
  /** How the job was prepared to be cut: a router's measured kerf is the width of its cut. */
  machineKind: 'laser' | 'router';
  /** The unit the page shows lengths in: the measured kerf is typed in it (the form keeps millimetres). */
  unit: LengthUnit;
  onSubmit: (v: RecordCutValues) => void;
  onClose: () => void;
}) {
  const {
    register,
    handleSubmit,
    control,
    formState: { errors },
  } = useForm<RecordCutValues>({
    resolver: zodResolver(recordCutSchemaFor(props.machineKind)),
    // The empty fields start undefined: NaN would be written into the number inputs as the text "NaN".
    defaultValues: { sheetsUsed: props.preparedSheets ?? 1 },
  });
  const sheetsUsed = useWatch({ control, name: 'sheetsUsed' });
  const farAbove = isFarAboveSheets(sheetsUsed, props.preparedSheets);
  // The count the operator confirmed: another count needs its own confirmation.
  const [confirmed, setConfirmed] = useState<number | null>(null);
  const needsConfirmation = farAbove && confirmed !== sheetsUsed;
  const n = { valueAsNumber: true } as const;
  return (
    <Dialog
      open={props.open}
      onClose={props.onClose}
      fullWidth
      maxWidth="sm"
      aria-labelledby="cut-title"
      slotProps={{ transition: FOCUS_FIRST_FIELD_ON_OPEN }}
    >
      <form
        noValidate
        onSubmit={handleSubmit((v) => {
          if (!needsConfirmation) props.onSubmit(v);
        })}
      >
        <DialogTitle id="cut-title">Record the cut</DialogTitle>
        <DialogContent>
          {props.error ? <FormErrorAlert error={props.error} /> : null}
          <Stack spacing={2} sx={{ mt: 1 }}>
            <FormTextField
              label="Machine time (minutes)"
              type="number"
              registration={register('actualMinutes', n)}
              error={errors.actualMinutes}
              slotProps={{ htmlInput: { step: 'any' } }}
            />
            <FormTextField
              label="Sheets used"
              type="number"
              registration={register('sheetsUsed', n)}
              error={errors.sheetsUsed}
            />
            {farAbove && props.preparedSheets !== null ? (
              <Alert severity="warning" data-testid="sheets-far-above">
                {`${countOf(sheetsUsed, 'sheet')} is far more than the ${countOf(props.preparedSheets, 'sheet')} the preparation laid out. Check the number before recording it.`}
                <FormControlLabel
                  sx={{ display: 'flex', mt: 1 }}
                  label={`Yes, ${countOf(sheetsUsed, 'sheet')} went into this cut`}
                  control={
                    <Checkbox
                      checked={confirmed === sheetsUsed}
                      onChange={(e) => setConfirmed(e.target.checked ? sheetsUsed : null)}
                    />
                  }
                />
              </Alert>
            ) : null}
            <LengthField
              label={
                props.machineKind === 'router'
                  ? 'Measured cut width (mm, optional)'
                  : 'Measured kerf (mm, optional)'
              }
              name="measuredKerfMm"
              unit={props.unit}
              inchDecimals={KERF_INCH_DECIMALS}
              control={control}
              form={{ register, errors }}
            />
          </Stack>
        </DialogContent>
        <DialogActions>
          <Button onClick={props.onClose}>Cancel</Button>
          <Button type="submit" variant="contained" disabled={props.busy || needsConfirmation}>
            Record the cut
          </Button>
        </DialogActions>
      </form>
    </Dialog>
  );
}
