import { COLOUR_RULES, type UploadedSolid } from '@kerfwright/contracts';
import { listSolids } from '@kerfwright/geometry';
import Button from '@mui/material/Button';
import Checkbox from '@mui/material/Checkbox';
import FormControlLabel from '@mui/material/FormControlLabel';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import { memo, type ReactNode } from 'react';
import { Controller, type UseFormReturn, useFormState, useWatch } from 'react-hook-form';
import { FormTextField } from '../../../components/ui/form-text-field';
import { type DesignFormValues } from './design-form-schema';
import { SolidDropZone } from './solid-drop-zone';

const SOLIDS = listSolids();

const SCALE_LABELS: Record<DesignFormValues['scaleBy'], string> = {
  diameter: 'Overall diameter',
  planeDistance: 'Centre to nearest piece plane',
  pieceCircumradius: 'Piece size (circumradius)',
  fitSheets: 'Fit to sheets (largest on N sheets)',
  fitBed: 'Fit to the machine bed',
};

const RULE_LABELS: Record<(typeof COLOUR_RULES)[number], string> = {
  'neighbour-distinct': 'Neighbours differ',
  'vertex-distinct': 'All pieces around a vertex differ',
  'opposite-match': 'Opposite pieces match, neighbours differ',
};

function Section({ title, children }: { title: string; children: ReactNode }) {
  return (
    <Stack spacing={1.5}>
      <Typography variant="overline" color="text.secondary">
        {title}
      </Typography>
      {children}
    </Stack>
  );
}

/**
 * The spec's fields. Every change goes to the live preview; messages show under the fields. The fields are
 * uncontrolled and the form state is read here (useFormState), so the studio's re-render on each keystroke
 * skips this form (memo) unless the suggestions change.
 */
export const SpecForm = memo(function SpecForm({
  form,
  upload,
  onUpload,
  suggestedSizes,
}: {
  form: UseFormReturn<DesignFormValues>;
  upload: UploadedSolid | null;
  onUpload: (solid: UploadedSolid) => void;
  suggestedSizes: { touch: number | null; overlap: number | null } | null;
}) {
  const { register, control, setValue } = form;
  const { errors } = useFormState({ control });
  const [solidSource, machineKind, scaleBy] = useWatch({
    control,
    name: ['solidSource', 'machineKind', 'scaleBy'],
  });
  const n = { valueAsNumber: true } as const;
  const native = { select: { native: true } } as const;
  const setSize = (size: number) =>
    setValue('size', Number(size.toFixed(4)), { shouldValidate: true, shouldDirty: true });

  return (
    <Stack spacing={2.5} component="fieldset" sx={{ border: 0, p: 0, m: 0 }}>
      <Section title="Design">
        <FormTextField label="Name" registration={register('name')} error={errors.name} size="small" />
        <FormTextField
          label="Description"
          registration={register('description')}
          error={errors.description}
          size="small"
          multiline
          minRows={2}
        />
      </Section>

      <Section title="Base solid">
        <FormTextField
          select
          slotProps={native}
          label="Source"
          registration={register('solidSource')}
          error={errors.solidSource}
          size="small"
        >
          <option value="catalogue">From the catalogue</option>
          <option value="upload">Uploaded OBJ / OFF file</option>
        </FormTextField>
        {solidSource === 'catalogue' ? (
          <FormTextField
            select
            slotProps={native}
            label="Solid"
            registration={register('solidId')}
            error={errors.solidId}
            size="small"
          >
            {SOLIDS.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name}
              </option>
            ))}
          </FormTextField>
        ) : (
          <SolidDropZone upload={upload} onUpload={onUpload} />
        )}
      </Section>

      <Section title="Piece shape">
        <Stack direction="row" spacing={1}>
          <FormTextField
            label="Sides (n)"
            type="number"
            registration={register('sides', n)}
            error={errors.sides}
            size="small"
          />
          <FormTextField
            label="Step (k)"
            type="number"
            registration={register('step', n)}
            error={errors.step}
            size="small"
            helperText="1 = polygon"
          />
        </Stack>
        <Stack direction="row" spacing={1}>
          <FormTextField
            label="Rotation (°)"
            type="number"
            registration={register('rotationDeg', n)}
            error={errors.rotationDeg}
            size="small"
            slotProps={{ htmlInput: { step: 'any' } }}
          />
          <FormTextField
            label="Size"
            type="number"
            registration={register('size', n)}
            error={errors.size}
            size="small"
            helperText="× plane distance"
            slotProps={{ htmlInput: { step: 'any' } }}
          />
        </Stack>
        {suggestedSizes && (suggestedSizes.touch !== null || suggestedSizes.overlap !== null) ? (
          <Stack direction="row" spacing={1} sx={{ alignItems: 'center' }} data-testid="suggested-sizes">
            <Typography variant="body2" color="text.secondary">
              Engine suggests:
            </Typography>
            {suggestedSizes.touch !== null ? (
              <Button size="small" onClick={() => setSize(suggestedSizes.touch ?? 0)}>
                {`touch ${suggestedSizes.touch.toFixed(3)}`}
              </Button>
            ) : null}
            {suggestedSizes.overlap !== null ? (
              <Button size="small" onClick={() => setSize(suggestedSizes.overlap ?? 0)}>
                {`overlap ${suggestedSizes.overlap.toFixed(3)}`}
              </Button>
            ) : null}
          </Stack>
        ) : null}
      </Section>

      <Section title="Scale">
        <FormTextField
          select
          slotProps={native}
          label="Scale by"
          registration={register('scaleBy')}
          error={errors.scaleBy}
          size="small"
        >
          {Object.entries(SCALE_LABELS).map(([value, label]) => (
            <option key={value} value={value}>
              {label}
            </option>
          ))}
        </FormTextField>
        {scaleBy === 'fitSheets' ? (
          <FormTextField
            label="Sheets"
            type="number"
            registration={register('fitSheets', n)}
            error={errors.fitSheets}
            size="small"
            helperText="of the stock sheet size below"
          />
        ) : scaleBy === 'fitBed' ? (
          <Stack direction="row" spacing={1}>
            <FormTextField
              label="Bed width (mm)"
              type="number"
              registration={register('bedWidthMm', n)}
              error={errors.bedWidthMm}
              size="small"
              slotProps={{ htmlInput: { step: 'any' } }}
            />
            <FormTextField
              label="Bed height (mm)"
              type="number"
              registration={register('bedHeightMm', n)}
              error={errors.bedHeightMm}
              size="small"
              slotProps={{ htmlInput: { step: 'any' } }}
            />
          </Stack>
        ) : (
          <FormTextField
            label="Scale (mm)"
            type="number"
            registration={register('scaleMm', n)}
            error={errors.scaleMm}
            size="small"
            slotProps={{ htmlInput: { step: 'any' } }}
          />
        )}
      </Section>

      <Section title="Stock sheet">
        <Stack direction="row" spacing={1}>
          <FormTextField
            label="Sheet width (mm)"
            type="number"
            registration={register('sheetWidthMm', n)}
            error={errors.sheetWidthMm}
            size="small"
            slotProps={{ htmlInput: { step: 'any' } }}
          />
          <FormTextField
            label="Sheet height (mm)"
            type="number"
            registration={register('sheetHeightMm', n)}
            error={errors.sheetHeightMm}
            size="small"
            slotProps={{ htmlInput: { step: 'any' } }}
          />
        </Stack>
        <Stack direction="row" spacing={1}>
          <FormTextField
            label="Margin (mm)"
            type="number"
            registration={register('marginMm', n)}
            error={errors.marginMm}
            size="small"
            slotProps={{ htmlInput: { step: 'any' } }}
          />
          <FormTextField
            label="Gap (mm)"
            type="number"
            registration={register('gapMm', n)}
            error={errors.gapMm}
            size="small"
            slotProps={{ htmlInput: { step: 'any' } }}
          />
        </Stack>
      </Section>

      <Section title="Stock and machine">
        <Stack direction="row" spacing={1} sx={{ alignItems: 'center' }}>
          <FormTextField
            label="Thickness (mm)"
            type="number"
            registration={register('thicknessMm', n)}
            error={errors.thicknessMm}
            size="small"
            slotProps={{ htmlInput: { step: 'any' } }}
          />
          <Controller
            control={control}
            name="flexible"
            render={({ field }) => (
              <FormControlLabel
                sx={{ minWidth: 110 }}
                label="Flexible"
                control={
                  <Checkbox checked={field.value} onChange={(e) => field.onChange(e.target.checked)} />
                }
              />
            )}
          />
        </Stack>
        <FormTextField
          select
          slotProps={native}
          label="Machine kind"
          registration={register('machineKind')}
          error={errors.machineKind}
          size="small"
        >
          <option value="laser">Laser (kerf)</option>
          <option value="router">Router (tool diameter)</option>
        </FormTextField>
        <Stack direction="row" spacing={1}>
          {machineKind === 'laser' ? (
            <FormTextField
              label="Kerf (mm)"
              type="number"
              registration={register('kerfMm', n)}
              error={errors.kerfMm}
              size="small"
              slotProps={{ htmlInput: { step: 'any' } }}
            />
          ) : (
            <FormTextField
              label="Tool diameter (mm)"
              type="number"
              registration={register('toolDiameterMm', n)}
              error={errors.toolDiameterMm}
              size="small"
              slotProps={{ htmlInput: { step: 'any' } }}
            />
          )}
          <FormTextField
            label="Fit allowance (mm)"
            type="number"
            registration={register('fitMm', n)}
            error={errors.fitMm}
            size="small"
            helperText="negative = press fit"
            slotProps={{ htmlInput: { step: 'any' } }}
          />
        </Stack>
      </Section>

      <Section title="Colours">
        <Stack direction="row" spacing={1}>
          <FormTextField
            label="Colours"
            type="number"
            registration={register('colourCount', n)}
            error={errors.colourCount}
            size="small"
            sx={{ maxWidth: 110 }}
          />
          <FormTextField
            select
            slotProps={native}
            label="Rule"
            registration={register('colourRule')}
            error={errors.colourRule}
            size="small"
          >
            {COLOUR_RULES.map((rule) => (
              <option key={rule} value={rule}>
                {RULE_LABELS[rule]}
              </option>
            ))}
          </FormTextField>
        </Stack>
      </Section>
    </Stack>
  );
});
