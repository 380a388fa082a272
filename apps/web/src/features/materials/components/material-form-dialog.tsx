import { zodResolver } from '@hookform/resolvers/zod';
import {
  findMaterialHazard,
  laserRefusal,
  MATERIAL_FAMILIES,
  type MaterialHazard,
  type MaterialView,
} from '@kerfwright/contracts';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Checkbox from '@mui/material/Checkbox';
import FormControlLabel from '@mui/material/FormControlLabel';
import FormHelperText from '@mui/material/FormHelperText';
import IconButton from '@mui/material/IconButton';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import { useEffect, useMemo } from 'react';
import { resetUnlessSame } from '../../../lib/reset-unless-same';
import { Controller, type Path, useFieldArray, useForm, useWatch } from 'react-hook-form';
import { FormDialog, type FormDialogBaseProps } from '../../../components/ui/form-dialog';
import { FormTextField, upperCased } from '../../../components/ui/form-text-field';
import { NativeSelectField } from '../../../components/ui/native-select-field';
import { LengthField } from '../../../components/ui/length-field';
import { NumberField } from '../../../components/ui/number-field';
import { type LengthUnit } from '../../../lib/units';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import {
  EMPTY_STOCK_SHEET,
  EMPTY_MATERIAL,
  type MaterialFormValues,
  materialFormSchema,
  materialToFormValues,
} from './material-form-schema';
import { FAMILY_LABELS } from './material-labels';

const SERVER_FIELDS: Path<MaterialFormValues>[] = [
  'name',
  'family',
  'nominalThicknessMm',
  'measuredThicknessMm',
  'colours',
  'stockSheets',
  'laserAllowed',
  'hazardNote',
  'notes',
];

interface MaterialFormDialogProps extends FormDialogBaseProps<MaterialFormValues> {
  /** The material to change, or null to add a new one. */
  material: MaterialView | null;
  hazards: readonly MaterialHazard[] | undefined;
  /** A supervisor may put a material kept off the laser back on it; others only keep it off (the API agrees). */
  canLiftLaserRestriction: boolean;
  /** The unit thicknesses and sheet sizes are typed in; the form keeps millimetres. */
  unit: LengthUnit;
}

/** Adds or changes a material of the library; the laser rules follow the workshop's hazard table. */
export function MaterialFormDialog(props: MaterialFormDialogProps) {
  const { material, hazards } = props;
  const schema = useMemo(() => materialFormSchema(hazards), [hazards]);
  const {
    register,
    control,
    handleSubmit,
    setValue,
    getValues,
    setError,
    reset,
    formState: { errors },
  } = useForm<MaterialFormValues>({
    resolver: zodResolver(schema),
    defaultValues: material ? materialToFormValues(material) : EMPTY_MATERIAL,
  });
  const sheets = useFieldArray({ control, name: 'stockSheets' });
  const family = useWatch({ control, name: 'family' });
  const laserAllowed = useWatch({ control, name: 'laserAllowed' });
  const refusal = hazards ? laserRefusal(family, hazards) : null;
  const condition = hazards ? findMaterialHazard(family, hazards)?.condition : undefined;
  // A stored material kept off the laser stays off unless a supervisor decides otherwise.
  const laserLocked = material !== null && !material.laserAllowed && !props.canLiftLaserRestriction;
  // Nor does it leave a family the hazard table refuses: reclassifying is the first step of the same decision.
  const familyLocked =
    material !== null &&
    hazards !== undefined &&
    laserRefusal(material.family, hazards) !== null &&
    !props.canLiftLaserRestriction;

  useEffect(() => {
    if (props.open)
      resetUnlessSame({ getValues, reset }, material ? materialToFormValues(material) : EMPTY_MATERIAL);
  }, [props.open, material, reset, getValues]);

  // Allowed on the laser again: the note that said why it was kept off no longer holds (the API drops it too).
  useEffect(() => {
    if (material && !material.laserAllowed && laserAllowed && getValues('hazardNote') === material.hazardNote)
      setValue('hazardNote', '');
  }, [material, laserAllowed, getValues, setValue]);

  // A family the hazard table refuses is never laser-allowed: untick it as soon as it is chosen.
  useEffect(() => {
    if (refusal !== null) setValue('laserAllowed', false);
  }, [refusal, setValue]);

  useEffect(() => {
    if (props.error) applyServerFieldErrors(props.error, setError, SERVER_FIELDS);
  }, [props.error, setError]);

  const fields = { register, errors };
  const submit = handleSubmit((v) => props.onSubmit(v));

  return (
    <FormDialog
      open={props.open}
      titleId="material-form-title"
      title={material ? `Change ${material.name}` : 'Add a material'}
      error={props.error}
      busy={props.busy}
      submitLabel={material ? 'Save changes' : 'Add the material'}
      onSubmit={submit}
      onClose={props.onClose}
      maxWidth="md"
    >
      <Stack spacing={2} sx={{ mt: 1 }}>
        <Box sx={{ display: 'grid', gap: 2, gridTemplateColumns: { xs: '1fr', sm: '2fr 1fr' } }}>
          <FormTextField label="Name" registration={register('name')} error={errors.name} />
          <NativeSelectField
            label="Family"
            name="family"
            form={fields}
            disabled={familyLocked}
            helperText={
              familyLocked ? 'Only a supervisor moves a material out of a refused family' : undefined
            }
          >
            {MATERIAL_FAMILIES.map((f) => (
              <option key={f} value={f}>
                {FAMILY_LABELS[f]}
              </option>
            ))}
          </NativeSelectField>
        </Box>
        <Box sx={{ display: 'grid', gap: 2, gridTemplateColumns: { xs: '1fr', sm: '1fr 1fr 1fr' } }}>
          <LengthField
            label="Nominal thickness (mm)"
            name="nominalThicknessMm"
            form={fields}
            control={control}
            unit={props.unit}
          />
          <LengthField
            control={control}
            unit={props.unit}
            label="Measured thickness (mm, optional)"
            name="measuredThicknessMm"
            form={fields}
            helperText="Callipers on the stock on hand; designs use it when given"
          />
          <Controller
            control={control}
            name="flexible"
            render={({ field }) => (
              <FormControlLabel
                label="Flexible stock (card, felt)"
                control={
                  // A refused family shows unticked in the same render that says why (the value follows below).
                  <Checkbox
                    checked={field.value && refusal === null}
                    onChange={(e) => field.onChange(e.target.checked)}
                  />
                }
              />
            )}
          />
        </Box>
        <FormTextField
          label="Colours offered"
          registration={register('colours')}
          error={errors.colours}
          helperText="Separate colours with commas, e.g. natural, black"
        />

        <Box component="fieldset" sx={{ border: 0, p: 0, m: 0 }}>
          <Typography component="legend" variant="subtitle2" sx={{ mb: 1 }}>
            Stock sheets
          </Typography>
          <Stack spacing={1}>
            {sheets.fields.map((field, i) => {
              const e = errors.stockSheets?.[i];
              return (
                <Box
                  key={field.id}
                  role="group"
                  aria-label={`Sheet size ${i + 1}`}
                  sx={{
                    display: 'grid',
                    gap: 1,
                    alignItems: 'start',
                    gridTemplateColumns: { xs: '1fr 1fr', sm: '1fr 1fr 1fr 0.7fr auto' },
                  }}
                >
                  <LengthField
                    id={`sheet-${i}-width`}
                    size="small"
                    label="Width (mm)"
                    name={`stockSheets.${i}.widthMm`}
                    form={fields}
                    control={control}
                    unit={props.unit}
                  />
                  <LengthField
                    id={`sheet-${i}-height`}
                    size="small"
                    label="Height (mm)"
                    name={`stockSheets.${i}.heightMm`}
                    form={fields}
                    control={control}
                    unit={props.unit}
                  />
                  <NumberField
                    id={`sheet-${i}-price`}
                    size="small"
                    label="Price per sheet"
                    name={`stockSheets.${i}.pricePerSheet`}
                    form={fields}
                  />
                  <FormTextField
                    id={`sheet-${i}-currency`}
                    size="small"
                    label="Currency"
                    registration={upperCased(register(`stockSheets.${i}.currency`))}
                    error={e?.currency}
                    slotProps={{ htmlInput: { maxLength: 3 } }}
                  />
                  <IconButton
                    aria-label={`Remove sheet size ${i + 1}`}
                    onClick={() => sheets.remove(i)}
                    sx={{ mt: 0.5 }}
                  >
                    ×
                  </IconButton>
                </Box>
              );
            })}
          </Stack>
          {errors.stockSheets?.message ? (
            <FormHelperText error>{errors.stockSheets.message}</FormHelperText>
          ) : null}
          <Button size="small" sx={{ mt: 1 }} onClick={() => sheets.append({ ...EMPTY_STOCK_SHEET })}>
            Add a sheet size
          </Button>
        </Box>

        <Box>
          {refusal !== null ? (
            <Alert severity="error" sx={{ mb: 1 }} data-testid="family-refused">
              {refusal}
            </Alert>
          ) : condition ? (
            <Alert severity="warning" sx={{ mb: 1 }}>
              Laser only when: {condition}
            </Alert>
          ) : null}
          <Controller
            control={control}
            name="laserAllowed"
            render={({ field }) => (
              <FormControlLabel
                label="May be cut on a laser"
                disabled={refusal !== null || laserLocked}
                control={
                  // A refused family shows unticked in the same render that says why (the value follows below).
                  <Checkbox
                    checked={field.value && refusal === null}
                    onChange={(e) => field.onChange(e.target.checked)}
                  />
                }
              />
            )}
          />
          {laserLocked && refusal === null ? (
            <FormHelperText data-testid="laser-locked">
              Kept off the laser: only a supervisor can allow it on the laser again.
            </FormHelperText>
          ) : null}
          {errors.laserAllowed ? <FormHelperText error>{errors.laserAllowed.message}</FormHelperText> : null}
        </Box>
        <FormTextField
          label={laserAllowed ? 'Hazard note' : 'Why it is kept off the laser'}
          registration={register('hazardNote')}
          error={errors.hazardNote}
          helperText={
            refusal !== null
              ? 'Left empty, the hazard table’s reason is recorded'
              : 'What the operator should watch for (fumes, flames, extraction)'
          }
          multiline
          minRows={2}
        />
        <FormTextField
          label="Notes"
          registration={register('notes')}
          error={errors.notes}
          multiline
          minRows={2}
        />
      </Stack>
    </FormDialog>
  );
}
