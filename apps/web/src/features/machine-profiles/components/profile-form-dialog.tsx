import { zodResolver } from '@hookform/resolvers/zod';
import { isLaserKind, MACHINE_PROFILE_KINDS, type MaterialView } from '@kerfwright/contracts';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import CircularProgress from '@mui/material/CircularProgress';
import FormHelperText from '@mui/material/FormHelperText';
import IconButton from '@mui/material/IconButton';
import Paper from '@mui/material/Paper';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import { useEffect, useMemo } from 'react';
import { resetUnlessSame } from '../../../lib/reset-unless-same';
import { useFieldArray, useForm, useWatch } from 'react-hook-form';
import { FormDialog, type FormDialogBaseProps } from '../../../components/ui/form-dialog';
import { FormErrorAlert } from '../../../components/ui/form-error-alert';
import { FormTextField, upperCased } from '../../../components/ui/form-text-field';
import { NativeSelectField } from '../../../components/ui/native-select-field';
import { LengthField } from '../../../components/ui/length-field';
import { NumberField } from '../../../components/ui/number-field';
import { KERF_INCH_DECIMALS, type LengthUnit } from '../../../lib/units';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { KIND_LABELS } from './profile-labels';
import { EMPTY_SETTING, type ProfileFormValues, profileFormSchema } from './profile-form-schema';

export type ProfileFormMode = 'create' | 'new-version' | 'edit-draft';

const TITLES: Record<ProfileFormMode, string> = {
  create: 'New machine profile',
  'new-version': 'Draft a new version',
  'edit-draft': 'Change the draft',
};

const SUBMIT_LABELS: Record<ProfileFormMode, string> = {
  create: 'Create as draft',
  'new-version': 'Save the draft',
  'edit-draft': 'Save the draft',
};

interface ProfileFormDialogProps extends FormDialogBaseProps<ProfileFormValues> {
  mode: ProfileFormMode;
  initial: ProfileFormValues;
  /** The materials a setting can name; undefined while they load. */
  materials: readonly MaterialView[] | undefined;
  /** Why the materials could not be loaded, if they could not. */
  materialsError?: unknown;
  /** The unit lengths and speeds are typed in; the form keeps millimetres (and millimetres per second). */
  unit: LengthUnit;
}

/**
 * The cutting values of one material: as many columns as fit, at most three, each wide enough for its whole
 * label ("Spindle (rpm, optional)" is the longest); on a phone, one column.
 */
const SETTING_VALUES_GRID = {
  display: 'grid',
  gap: '8px',
  alignItems: 'start',
  gridTemplateColumns: 'repeat(auto-fill, minmax(min(100%, max(12.5rem, calc((100% - 16px) / 3))), 1fr))',
} as const;

/** Bed, speeds, rate and the per-material cutting values of a profile version; saved as a draft. */
export function ProfileFormDialog(props: ProfileFormDialogProps) {
  const { materials, materialsError, mode, unit } = props;
  const schema = useMemo(() => profileFormSchema(materials), [materials]);
  const {
    register,
    control,
    handleSubmit,
    reset,
    getValues,
    setError,
    formState: { errors },
  } = useForm<ProfileFormValues>({ resolver: zodResolver(schema), defaultValues: props.initial });
  const settings = useFieldArray({ control, name: 'settings' });
  const kind = useWatch({ control, name: 'kind' });
  // Each row is named by its material for screen readers, which otherwise hear the same labels row after row.
  const chosenMaterials = useWatch({ control, name: 'settings' });
  const router = kind === 'cnc-router';
  const laser = isLaserKind(kind);

  useEffect(() => {
    if (props.open) resetUnlessSame({ getValues, reset }, props.initial);
  }, [props.open, props.initial, reset, getValues]);

  useEffect(() => {
    if (props.error) {
      applyServerFieldErrors(props.error, setError, [
        'name',
        'bedWidthMm',
        'bedHeightMm',
        'rapidSpeedMmS',
        'hourlyRate',
        'currency',
        'notes',
      ]);
    }
  }, [props.error, setError]);

  const fields = { register, errors };
  const submit = handleSubmit((v) => props.onSubmit(v));

  return (
    <FormDialog
      open={props.open}
      titleId="profile-form-title"
      title={TITLES[mode]}
      error={props.error}
      busy={props.busy}
      submitLabel={SUBMIT_LABELS[mode]}
      onSubmit={submit}
      onClose={props.onClose}
      maxWidth="lg"
    >
      <Stack spacing={2} sx={{ mt: 1 }}>
        {mode === 'create' ? (
          <Box sx={{ display: 'grid', gap: 2, gridTemplateColumns: { xs: '1fr', sm: '2fr 1fr' } }}>
            <FormTextField label="Profile name" registration={register('name')} error={errors.name} />
            <NativeSelectField label="Kind of machine" name="kind" form={fields}>
              {MACHINE_PROFILE_KINDS.map((k) => (
                <option key={k} value={k}>
                  {KIND_LABELS[k]}
                </option>
              ))}
            </NativeSelectField>
          </Box>
        ) : (
          <Typography color="text.secondary">
            {props.initial.name} · {KIND_LABELS[kind]}. The new draft starts from the values below; a
            supervisor approves it before jobs use it.
          </Typography>
        )}
        <Box
          sx={{
            display: 'grid',
            gap: 2,
            gridTemplateColumns: { xs: '1fr', sm: '1fr 1fr', md: 'repeat(5, 1fr)' },
          }}
        >
          <LengthField label="Bed width (mm)" name="bedWidthMm" form={fields} control={control} unit={unit} />
          <LengthField
            label="Bed height (mm)"
            name="bedHeightMm"
            form={fields}
            control={control}
            unit={unit}
          />
          <LengthField
            label="Rapid speed (mm/s)"
            name="rapidSpeedMmS"
            form={fields}
            control={control}
            unit={unit}
          />
          <NumberField label="Hourly rate" name="hourlyRate" form={fields} />
          <FormTextField
            label="Currency"
            registration={upperCased(register('currency'))}
            error={errors.currency}
            slotProps={{ htmlInput: { maxLength: 3 } }}
          />
        </Box>

        <Typography variant="subtitle1" component="h3">
          Settings per material
        </Typography>
        {laser ? (
          <Alert severity="warning">
            Materials kept off the laser cannot be given laser settings. Test new values on an offcut under
            supervision, following the machine maker’s manual and the workshop’s rules.
          </Alert>
        ) : null}
        {/*
          The material selects are the browser's own, bound to the form without React state: a select shown
          before its options exist falls back to "Choose…" and stays there when the options come. So the rows
          wait for the materials, and each select appears with its material's option already in it.
        */}
        {materials === undefined ? (
          materialsError ? (
            <FormErrorAlert error={materialsError} />
          ) : (
            <Stack direction="row" spacing={1} sx={{ alignItems: 'center' }}>
              <CircularProgress size={20} aria-label="Loading the materials" />
              <Typography color="text.secondary">Loading the materials…</Typography>
            </Stack>
          )
        ) : null}
        {(materials === undefined ? [] : settings.fields).map((field, i) => {
          const materialId = chosenMaterials?.[i]?.materialId;
          const materialName = materials?.find((m) => m.id === materialId)?.name;
          const rowName = `Material setting ${i + 1}: ${materialName ?? 'no material chosen yet'}`;
          return (
            <Paper key={field.id} variant="outlined" role="group" aria-label={rowName} sx={{ p: 1.5 }}>
              <Box sx={{ display: 'flex', gap: 1, alignItems: 'start', mb: 1 }}>
                <NativeSelectField
                  id={`settings-${i}-material`}
                  size="small"
                  label="Material"
                  name={`settings.${i}.materialId`}
                  form={fields}
                  sx={{ flex: 1, maxWidth: '28rem' }}
                >
                  <option value="">Choose…</option>
                  {materials?.map((m) => (
                    <option key={m.id} value={m.id} disabled={laser && !m.laserAllowed}>
                      {m.laserAllowed ? m.name : `${m.name} (not for lasers)`}
                    </option>
                  ))}
                </NativeSelectField>
                <IconButton
                  aria-label={`Remove material setting ${i + 1}${materialName ? `: ${materialName}` : ''}`}
                  onClick={() => settings.remove(i)}
                  sx={{ ml: 'auto' }}
                >
                  ×
                </IconButton>
              </Box>
              <Box sx={SETTING_VALUES_GRID} data-testid="setting-values">
                {router ? (
                  <LengthField
                    id={`settings-${i}-tool`}
                    size="small"
                    label="Tool diameter (mm)"
                    name={`settings.${i}.toolDiameterMm`}
                    form={fields}
                    control={control}
                    unit={unit}
                    inchDecimals={KERF_INCH_DECIMALS}
                  />
                ) : (
                  <LengthField
                    id={`settings-${i}-kerf`}
                    size="small"
                    label="Kerf (mm)"
                    name={`settings.${i}.kerfMm`}
                    form={fields}
                    control={control}
                    unit={unit}
                    inchDecimals={KERF_INCH_DECIMALS}
                  />
                )}
                <LengthField
                  id={`settings-${i}-cut`}
                  size="small"
                  label="Cut speed (mm/s)"
                  name={`settings.${i}.cutSpeedMmS`}
                  form={fields}
                  control={control}
                  unit={unit}
                />
                <LengthField
                  id={`settings-${i}-mark`}
                  size="small"
                  label="Mark speed (mm/s)"
                  name={`settings.${i}.markSpeedMmS`}
                  form={fields}
                  control={control}
                  unit={unit}
                />
                {router ? (
                  <NumberField
                    id={`settings-${i}-spindle`}
                    size="small"
                    label="Spindle (rpm, optional)"
                    name={`settings.${i}.spindleRpm`}
                    form={fields}
                    integer
                  />
                ) : (
                  <NumberField
                    id={`settings-${i}-power`}
                    size="small"
                    label={laser ? 'Power (%)' : 'Power (%, optional)'}
                    name={`settings.${i}.powerPct`}
                    form={fields}
                  />
                )}
                <NumberField
                  id={`settings-${i}-passes`}
                  size="small"
                  label="Passes"
                  name={`settings.${i}.passes`}
                  form={fields}
                  integer
                />
                <NumberField
                  id={`settings-${i}-pierce`}
                  size="small"
                  label="Pierce time (s)"
                  name={`settings.${i}.pierceTimeS`}
                  form={fields}
                />
              </Box>
            </Paper>
          );
        })}
        {errors.settings?.message ? <FormHelperText error>{errors.settings.message}</FormHelperText> : null}
        <Box>
          <Button
            size="small"
            disabled={materials === undefined}
            onClick={() => settings.append({ ...EMPTY_SETTING })}
          >
            Add a material
          </Button>
        </Box>
        <FormTextField
          label="Notes"
          registration={register('notes')}
          error={errors.notes}
          multiline
          minRows={2}
          helperText="Where the values come from (test coupon, batch, maker’s table)"
        />
      </Stack>
    </FormDialog>
  );
}
