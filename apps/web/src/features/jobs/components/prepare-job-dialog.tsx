import { zodResolver } from '@hookform/resolvers/zod';
import { COLOUR_RULES } from '@kerfwright/contracts';
import Checkbox from '@mui/material/Checkbox';
import FormControlLabel from '@mui/material/FormControlLabel';
import FormHelperText from '@mui/material/FormHelperText';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import { Controller, useForm, useWatch } from 'react-hook-form';
import { FormDialog, type FormDialogBaseProps } from '../../../components/ui/form-dialog';
import { FormErrorAlert } from '../../../components/ui/form-error-alert';
import { FormTextField } from '../../../components/ui/form-text-field';
import { NATIVE_SELECT, NativeSelectField } from '../../../components/ui/native-select-field';
import { COLOUR_RULE_LABELS } from '../../../config/colour-rules';
import { useMachineProfiles } from '../api/get-machine-profiles';
import { useMaterials } from '../api/get-materials';
import { type PrepareJobValues, prepareJobSchema } from './job-action-schemas';

export interface PrepareJobBody {
  materialId: string;
  profileVersionId: string;
  colours: string[];
  sheet?: { widthMm: number; heightMm: number };
  colourRule: PrepareJobValues['colourRule'];
}

/** The fabricator's choices: material, an approved machine profile version, colours and sheet size. */
export function PrepareJobDialog(props: FormDialogBaseProps<PrepareJobBody>) {
  const materials = useMaterials(props.open);
  const profiles = useMachineProfiles(props.open);
  const {
    register,
    control,
    handleSubmit,
    setValue,
    getValues,
    formState: { errors },
  } = useForm<PrepareJobValues>({
    resolver: zodResolver(prepareJobSchema),
    defaultValues: {
      materialId: '',
      profileVersionId: '',
      colours: [],
      sheetIndex: '0',
      colourRule: 'neighbour-distinct',
    },
  });
  const materialId = useWatch({ control, name: 'materialId' });
  const material = materials.data?.items.find((m) => m.id === materialId);
  // Only approved versions that hold settings for the chosen material can prepare the job.
  const approvedFor = (forMaterial: string) =>
    (profiles.data?.items ?? []).filter(
      (p) =>
        p.currentApproved &&
        (!forMaterial || p.currentApproved.settings.some((s) => s.materialId === forMaterial)),
    );
  const approved = approvedFor(materialId);
  const fields = { register, errors };

  const submit = handleSubmit((v) => {
    const sheet = material?.stockSheets[Number(v.sheetIndex)];
    props.onSubmit({
      materialId: v.materialId,
      profileVersionId: v.profileVersionId,
      colours: v.colours,
      colourRule: v.colourRule,
      sheet: sheet ? { widthMm: sheet.widthMm, heightMm: sheet.heightMm } : undefined,
    });
  });

  const materialField = register('materialId');
  return (
    <FormDialog
      open={props.open}
      titleId="prepare-title"
      title="Prepare the job"
      error={props.error}
      busy={props.busy}
      submitLabel="Prepare"
      onSubmit={submit}
      onClose={props.onClose}
    >
      {materials.isError ? <FormErrorAlert error={materials.error} /> : null}
      {profiles.isError ? <FormErrorAlert error={profiles.error} /> : null}
      <Stack spacing={2} sx={{ mt: 1 }}>
        <FormTextField
          select
          slotProps={NATIVE_SELECT}
          label="Material"
          registration={{
            ...materialField,
            onChange: async (e) => {
              setValue('colours', []);
              setValue('sheetIndex', '0');
              // A chosen version no longer offered for the new material is cleared.
              const chosen = getValues('profileVersionId');
              if (
                chosen &&
                !approvedFor(String(e.target.value)).some((p) => p.currentApproved?.id === chosen)
              )
                setValue('profileVersionId', '');
              return materialField.onChange(e);
            },
          }}
          error={errors.materialId}
        >
          <option value="">Choose…</option>
          {(materials.data?.items ?? []).map((m) => (
            <option key={m.id} value={m.id}>
              {`${m.name}${m.laserAllowed ? '' : ' (not for lasers)'}`}
            </option>
          ))}
        </FormTextField>
        <NativeSelectField label="Machine profile (approved version)" name="profileVersionId" form={fields}>
          <option value="">Choose…</option>
          {approved.map((p) => (
            <option key={p.id} value={p.currentApproved?.id}>
              {`${p.name} · ${p.kind} · v${p.currentApproved?.number}`}
            </option>
          ))}
        </NativeSelectField>
        {material ? (
          <>
            <Controller
              control={control}
              name="colours"
              render={({ field }) => (
                <Stack>
                  <Typography variant="body2" color="text.secondary">
                    Colours of stock
                  </Typography>
                  <Stack direction="row" sx={{ flexWrap: 'wrap' }}>
                    {material.colours.map((c) => (
                      <FormControlLabel
                        key={c}
                        label={c}
                        control={
                          <Checkbox
                            checked={field.value.includes(c)}
                            onChange={(e) =>
                              field.onChange(
                                e.target.checked ? [...field.value, c] : field.value.filter((x) => x !== c),
                              )
                            }
                          />
                        }
                      />
                    ))}
                  </Stack>
                  {errors.colours ? <FormHelperText error>{errors.colours.message}</FormHelperText> : null}
                </Stack>
              )}
            />
            <NativeSelectField label="Sheet" name="sheetIndex" form={fields}>
              {material.stockSheets.map((s, i) => (
                <option key={i} value={String(i)}>
                  {`${s.widthMm} × ${s.heightMm} mm · ${s.pricePerSheet} ${s.currency}`}
                </option>
              ))}
            </NativeSelectField>
          </>
        ) : errors.colours ? (
          <FormHelperText error>{errors.colours.message}</FormHelperText>
        ) : null}
        <NativeSelectField label="Colour rule" name="colourRule" form={fields}>
          {COLOUR_RULES.map((r) => (
            <option key={r} value={r}>
              {COLOUR_RULE_LABELS[r]}
            </option>
          ))}
        </NativeSelectField>
      </Stack>
    </FormDialog>
  );
}
