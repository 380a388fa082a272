import { zodResolver } from '@hookform/resolvers/zod';
import { type MachineProfileKind } from '@kerfwright/contracts';
import Stack from '@mui/material/Stack';
import { useEffect, useMemo } from 'react';
import { resetUnlessSame } from '../../../lib/reset-unless-same';
import { useForm } from 'react-hook-form';
import { FormDialog, type FormDialogBaseProps } from '../../../components/ui/form-dialog';
import { FormTextField } from '../../../components/ui/form-text-field';
import { LengthField } from '../../../components/ui/length-field';
import { KERF_INCH_DECIMALS, type LengthUnit } from '../../../lib/units';
import { type KerfRecordValues, kerfRecordSchema } from './kerf-record-schema';
import { NATIVE_SELECT } from '../../../components/ui/native-select-field';

/** Records a kerf measured on a test cut (callipers across a cut slot, or a coupon's lost width). */
export function KerfRecordDialog(
  props: FormDialogBaseProps<KerfRecordValues> & {
    kind: MachineProfileKind;
    /** The unit the measured value is typed in; the form keeps millimetres. */
    unit: LengthUnit;
    materials: readonly { id: string; name: string }[];
    defaultMaterialId: string;
  },
) {
  const schema = useMemo(() => kerfRecordSchema(props.kind), [props.kind]);
  const {
    register,
    control,
    handleSubmit,
    reset,
    getValues,
    formState: { errors },
  } = useForm<KerfRecordValues>({
    resolver: zodResolver(schema),
    // The measured value starts undefined: NaN would be written into the number input as the text "NaN".
    defaultValues: { materialId: props.defaultMaterialId, notes: '' },
  });
  useEffect(() => {
    if (props.open) resetUnlessSame({ getValues, reset }, { materialId: props.defaultMaterialId, notes: '' });
  }, [props.open, props.defaultMaterialId, reset, getValues]);
  const router = props.kind === 'cnc-router';
  const submit = handleSubmit((v) => props.onSubmit(v));
  return (
    <FormDialog
      open={props.open}
      titleId="kerf-record-title"
      title={`Record a measured ${router ? 'cut width' : 'kerf'}`}
      error={props.error}
      busy={props.busy}
      submitLabel="Record"
      onSubmit={submit}
      onClose={props.onClose}
    >
      <Stack spacing={2} sx={{ mt: 1 }}>
        <FormTextField
          select
          slotProps={NATIVE_SELECT}
          label="Material"
          registration={register('materialId')}
          error={errors.materialId}
        >
          <option value="">Choose…</option>
          {props.materials.map((m) => (
            <option key={m.id} value={m.id}>
              {m.name}
            </option>
          ))}
        </FormTextField>
        <LengthField
          label={router ? 'Measured cut width (mm)' : 'Measured kerf (mm)'}
          name="kerfMm"
          form={{ register, errors }}
          control={control}
          unit={props.unit}
          inchDecimals={KERF_INCH_DECIMALS}
        />
        <FormTextField
          label="Notes (optional)"
          registration={register('notes')}
          error={errors.notes}
          helperText="How it was measured: test coupon, batch, callipers"
        />
      </Stack>
    </FormDialog>
  );
}
