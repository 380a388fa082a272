import { COLOUR_RULES, type UploadedSolid } from '@kerfwright/contracts';
import { listSolids, smallestSoundSize } from '@kerfwright/geometry';
import Button from '@mui/material/Button';
import Checkbox from '@mui/material/Checkbox';
import FormControlLabel from '@mui/material/FormControlLabel';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import { memo, type ReactNode, useEffect, useRef, useState } from 'react';
import {
  Controller,
  type RegisterOptions,
  type UseFormReturn,
  useFormState,
  useWatch,
} from 'react-hook-form';
import { FormTextField } from '../../../components/ui/form-text-field';
import { NativeSelectField } from '../../../components/ui/native-select-field';
import { LengthField } from '../../../components/ui/length-field';
import { NumberField } from '../../../components/ui/number-field';
import {
  type DesignFormValues,
  designFormSchema,
  toDesignSpec,
  DESIGN_FIELD_LABELS,
  formatDesignSize,
} from './design-form-schema';
import { SolidDropZone } from './solid-drop-zone';
import { StockSheetPicker } from './stock-sheet-picker';
import { useMaterials } from '../../jobs/api/get-materials';
import { COLOUR_RULE_LABELS } from '../../../config/colour-rules';
import { KERF_INCH_DECIMALS, type LengthUnit } from '../../../lib/units';

const SOLIDS = listSolids();

/**
 * Fields checked together (the sheet must keep room inside its margins; a fit needs a sheet per colour; a
 * star's step stays under half its sides): a change to one re-checks the others, so a message goes away with
 * whichever field put it right.
 */
const SHEET_RULES: RegisterOptions<DesignFormValues> = {
  valueAsNumber: true,
  deps: ['sheetWidthMm', 'sheetHeightMm', 'marginMm'],
};
const SHAPE_RULES: RegisterOptions<DesignFormValues> = { valueAsNumber: true, deps: ['sides', 'step'] };
const COLOUR_SHEETS_RULES: RegisterOptions<DesignFormValues> = {
  valueAsNumber: true,
  deps: ['fitSheets', 'colourCount'],
};

const SCALE_LABELS: Record<DesignFormValues['scaleBy'], string> = {
  diameter: 'Overall diameter',
  planeDistance: 'Centre to nearest piece plane',
  pieceCircumradius: 'Piece size (circumradius)',
  fitSheets: 'Fit to sheets (largest on N sheets)',
  fitBed: 'Fit to the machine bed',
};

/** A group of the form's fields under its own heading, so that headings lead through the form too. */
function Section({ title, children }: { title: string; children: ReactNode }) {
  return (
    <Stack spacing={1.5}>
      <Typography component="h2" variant="overline" color="text.secondary">
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
  unit = 'mm',
  newDesign = false,
  onStockShown,
}: {
  form: UseFormReturn<DesignFormValues>;
  /** Told the material of the workshop stock the form's sheet and thickness are (see StockSheetPicker). */
  onStockShown?: (materialId: string | null) => void;
  /** A design not saved yet: it starts from the workshop's stock when its starting sheet is not stock. */
  newDesign?: boolean;
  /** The unit the lengths are shown and typed in (the form keeps millimetres). */
  unit?: LengthUnit;
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
  const fields = { register, errors };
  const materials = useMaterials(true);
  const setSize = (size: number) =>
    setValue('size', Number(formatDesignSize(size)), { shouldValidate: true, shouldDirty: true });
  // The sizes where pieces touch and first cross are thresholds, not designs (their crossings have no length):
  // the engine searches upwards from there for the smallest size that builds soundly (smallestSoundSize).
  const [soundSize, setSoundSize] = useState<string | null>(null);
  // The answer holds for the spec it was found for: any other change (stock, shape, solid…) withdraws it.
  const foundSize = useRef<number | null>(null);
  useEffect(() => {
    const subscription = form.watch((values, { name }) => {
      if (name === 'size' && values.size === foundSize.current) return;
      foundSize.current = null;
      setSoundSize((shown) => (shown === 'searching' ? shown : null));
    });
    return () => subscription.unsubscribe();
  }, [form]);
  const findSoundSize = () => {
    setSoundSize('searching');
    // Let the button show it is busy before the search (a few hundred builds at most) holds the page.
    setTimeout(() => {
      const parsed = designFormSchema.safeParse(form.getValues());
      const spec = parsed.success ? toDesignSpec(parsed.data, upload) : null;
      if (!spec) {
        setSoundSize('Correct the marked fields first.');
        return;
      }
      try {
        const found = smallestSoundSize(spec);
        if (found.size === null) {
          setSoundSize(
            `No size up to three times ${found.crossingsFrom != null ? formatDesignSize(found.crossingsFrom) : 'the crossing size'} builds soundly with this stock and machine: try a thinner stock, another rotation or another shape.`,
          );
          return;
        }
        foundSize.current = Number(formatDesignSize(found.size));
        setSize(found.size);
        setSoundSize(
          `${formatDesignSize(found.size)} is the smallest size that builds without errors, collisions or slots breaking through a tip` +
            (found.thinWebs
              ? ', though some slots leave thin material beside them (see the warnings).'
              : '.'),
        );
      } catch (error) {
        setSoundSize(error instanceof Error ? error.message : String(error));
      }
    }, 0);
  };

  return (
    <Stack spacing={2.5} component="fieldset" sx={{ border: 0, p: 0, m: 0 }}>
      <Section title="Design">
        <FormTextField
          label={DESIGN_FIELD_LABELS.name}
          registration={register('name')}
          error={errors.name}
          size="small"
        />
        <FormTextField
          label={DESIGN_FIELD_LABELS.description}
          registration={register('description')}
          error={errors.description}
          size="small"
          multiline
          minRows={2}
        />
      </Section>

      <Section title="Base solid">
        <NativeSelectField
          label={DESIGN_FIELD_LABELS.solidSource}
          name="solidSource"
          form={fields}
          size="small"
        >
          <option value="catalogue">From the catalogue</option>
          <option value="upload">Uploaded OBJ / OFF file</option>
        </NativeSelectField>
        {solidSource === 'catalogue' ? (
          <NativeSelectField label={DESIGN_FIELD_LABELS.solidId} name="solidId" form={fields} size="small">
            {SOLIDS.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name}
              </option>
            ))}
          </NativeSelectField>
        ) : (
          <SolidDropZone upload={upload} onUpload={onUpload} />
        )}
      </Section>

      <Section title="Piece shape">
        <Stack direction="row" spacing={1}>
          <NumberField
            label={DESIGN_FIELD_LABELS.sides}
            name="sides"
            form={fields}
            rules={SHAPE_RULES}
            size="small"
            integer
          />
          <NumberField
            label={DESIGN_FIELD_LABELS.step}
            name="step"
            form={fields}
            rules={SHAPE_RULES}
            size="small"
            helperText="1 = polygon"
            integer
          />
        </Stack>
        <Stack direction="row" spacing={1}>
          <NumberField
            label={DESIGN_FIELD_LABELS.rotationDeg}
            name="rotationDeg"
            form={fields}
            size="small"
          />
          <NumberField
            label={DESIGN_FIELD_LABELS.size}
            name="size"
            form={fields}
            size="small"
            helperText="× plane distance"
          />
        </Stack>
        {suggestedSizes?.overlap != null ? (
          <Stack spacing={0.5} data-testid="suggested-sizes">
            <Stack direction="row" spacing={1} sx={{ alignItems: 'center', flexWrap: 'wrap' }}>
              <Typography variant="body2" color="text.secondary">
                {`Pieces cross from size ${formatDesignSize(suggestedSizes.overlap)}.`}
              </Typography>
              <Button size="small" onClick={findSoundSize} loading={soundSize === 'searching'}>
                Smallest sound size
              </Button>
            </Stack>
            {soundSize && soundSize !== 'searching' ? (
              <Typography variant="body2" color="text.secondary" data-testid="sound-size">
                {soundSize}
              </Typography>
            ) : null}
          </Stack>
        ) : null}
      </Section>

      <Section title="Scale">
        <NativeSelectField label={DESIGN_FIELD_LABELS.scaleBy} name="scaleBy" form={fields} size="small">
          {Object.entries(SCALE_LABELS).map(([value, label]) => (
            <option key={value} value={value}>
              {label}
            </option>
          ))}
        </NativeSelectField>
        {scaleBy === 'fitSheets' ? (
          <NumberField
            label={DESIGN_FIELD_LABELS.fitSheets}
            name="fitSheets"
            form={fields}
            rules={COLOUR_SHEETS_RULES}
            size="small"
            helperText="of the stock sheet size below"
            integer
          />
        ) : scaleBy === 'fitBed' ? (
          <Stack direction="row" spacing={1}>
            <LengthField
              label={DESIGN_FIELD_LABELS.bedWidthMm}
              name="bedWidthMm"
              unit={unit}
              control={control}
              form={fields}
              size="small"
            />
            <LengthField
              label={DESIGN_FIELD_LABELS.bedHeightMm}
              name="bedHeightMm"
              unit={unit}
              control={control}
              form={fields}
              size="small"
            />
          </Stack>
        ) : (
          <LengthField
            label={DESIGN_FIELD_LABELS.scaleMm}
            name="scaleMm"
            unit={unit}
            control={control}
            form={fields}
            size="small"
          />
        )}
      </Section>

      <Section title="Stock sheet">
        <StockSheetPicker
          form={form}
          materials={materials.data?.items}
          unit={unit}
          adoptFirst={newDesign}
          onShown={onStockShown}
        />
        <Stack direction="row" spacing={1}>
          <LengthField
            label={DESIGN_FIELD_LABELS.sheetWidthMm}
            name="sheetWidthMm"
            unit={unit}
            control={control}
            form={fields}
            size="small"
            rules={SHEET_RULES}
          />
          <LengthField
            label={DESIGN_FIELD_LABELS.sheetHeightMm}
            name="sheetHeightMm"
            unit={unit}
            control={control}
            form={fields}
            size="small"
            rules={SHEET_RULES}
          />
        </Stack>
        <Stack direction="row" spacing={1}>
          <LengthField
            label={DESIGN_FIELD_LABELS.marginMm}
            name="marginMm"
            unit={unit}
            control={control}
            form={fields}
            size="small"
            rules={SHEET_RULES}
          />
          <LengthField
            label={DESIGN_FIELD_LABELS.gapMm}
            name="gapMm"
            unit={unit}
            control={control}
            form={fields}
            size="small"
          />
        </Stack>
      </Section>

      <Section title="Stock and machine">
        <Stack direction="row" spacing={1} sx={{ alignItems: 'center' }}>
          <LengthField
            label={DESIGN_FIELD_LABELS.thicknessMm}
            name="thicknessMm"
            unit={unit}
            control={control}
            form={fields}
            size="small"
          />
          <Controller
            control={control}
            name="flexible"
            render={({ field }) => (
              <FormControlLabel
                sx={{ minWidth: 110 }}
                label={DESIGN_FIELD_LABELS.flexible}
                control={
                  <Checkbox checked={field.value} onChange={(e) => field.onChange(e.target.checked)} />
                }
              />
            )}
          />
        </Stack>
        <NativeSelectField
          label={DESIGN_FIELD_LABELS.machineKind}
          name="machineKind"
          form={fields}
          size="small"
        >
          <option value="laser">Laser (kerf)</option>
          <option value="router">Router (tool diameter)</option>
        </NativeSelectField>
        <Stack direction="row" spacing={1}>
          {machineKind === 'laser' ? (
            <LengthField
              label={DESIGN_FIELD_LABELS.kerfMm}
              name="kerfMm"
              unit={unit}
              inchDecimals={KERF_INCH_DECIMALS}
              control={control}
              form={fields}
              size="small"
            />
          ) : (
            <LengthField
              label={DESIGN_FIELD_LABELS.toolDiameterMm}
              name="toolDiameterMm"
              unit={unit}
              inchDecimals={KERF_INCH_DECIMALS}
              control={control}
              form={fields}
              size="small"
            />
          )}
          <LengthField
            label={DESIGN_FIELD_LABELS.fitMm}
            name="fitMm"
            unit={unit}
            inchDecimals={KERF_INCH_DECIMALS}
            control={control}
            form={fields}
            size="small"
            helperText="negative = press fit"
          />
        </Stack>
      </Section>

      <Section title="Colours">
        <Stack direction="row" spacing={1}>
          <NumberField
            label={DESIGN_FIELD_LABELS.colourCount}
            name="colourCount"
            form={fields}
            rules={COLOUR_SHEETS_RULES}
            size="small"
            sx={{ maxWidth: 110 }}
            integer
          />
          <NativeSelectField
            label={DESIGN_FIELD_LABELS.colourRule}
            name="colourRule"
            form={fields}
            size="small"
          >
            {COLOUR_RULES.map((rule) => (
              <option key={rule} value={rule}>
                {COLOUR_RULE_LABELS[rule]}
              </option>
            ))}
          </NativeSelectField>
        </Stack>
      </Section>
    </Stack>
  );
});
