import { zodResolver } from '@hookform/resolvers/zod';
import { COLOUR_RULES, type DesignView, type MachineProfileSummaryView } from '@kerfwright/contracts';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Checkbox from '@mui/material/Checkbox';
import FormControlLabel from '@mui/material/FormControlLabel';
import FormHelperText from '@mui/material/FormHelperText';
import LinearProgress from '@mui/material/LinearProgress';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import { useEffect, useState } from 'react';
import { Controller, useForm, useWatch } from 'react-hook-form';
import { FormDialog, type FormDialogBaseProps } from '../../../components/ui/form-dialog';
import { FormTextField } from '../../../components/ui/form-text-field';
import { NATIVE_SELECT, NativeSelectField } from '../../../components/ui/native-select-field';
import { COLOUR_RULE_LABELS } from '../../../config/colour-rules';
import { useMachineProfiles } from '../api/get-machine-profiles';
import { useMaterials } from '../api/get-materials';
import { type PrepareJobValues, prepareJobSchema } from './job-action-schemas';
import { explainMaterialAndMachine, profilesFor, stockOfDesign } from './prepare-job-explanation';
import { kindLabel } from '../../../config/trade-labels';
import { errorMessage } from '../../../lib/api-client';
import { countOf } from '../../../lib/plural';
import { formatMoney, formatSheetSize, formatStockThickness, type LengthUnit } from '../../../lib/units';
import { useDesign } from '../../designs/api/get-design';

export interface PrepareJobBody {
  materialId: string;
  profileVersionId: string;
  colours: string[];
  sheet?: { widthMm: number; heightMm: number };
  colourRule: PrepareJobValues['colourRule'];
}

/** What a job was prepared with before, as the job lists it: the dialog starts from it. */
export interface PreparedChoices {
  materialId: string | null;
  profileVersionId: string | null;
  /** The profile's name, to find its approved version when the one used then has been retired. */
  profileName: string | null;
  sheet?: { widthMm: number; heightMm: number };
  colourRule?: PrepareJobValues['colourRule'];
}

interface PrepareJobDialogProps extends FormDialogBaseProps<PrepareJobBody> {
  /** The job's design: the colours it was drawn in are what the colours of stock chosen are held against. */
  designId?: string;
  /** The colours the job lists already (asked for, or chosen when it was prepared before). */
  jobColours?: readonly string[];
  /** The choices of the job's last preparation (prepared again, or requested again after a return). */
  prepared?: PreparedChoices;
  /** Lengths as the page shows them (sheet sizes; the stock list keeps millimetres). Default mm. */
  unit?: LengthUnit;
}

/** Where a sheet size stands in a material's stock list, either way round (-1: not listed any more). */
function stockSheetIndex(
  sheets: readonly { widthMm: number; heightMm: number }[],
  size: { widthMm: number; heightMm: number },
): number {
  return sheets.findIndex(
    (s) =>
      (s.widthMm === size.widthMm && s.heightMm === size.heightMm) ||
      (s.widthMm === size.heightMm && s.heightMm === size.widthMm),
  );
}

/** The job's colours that a material stocks, spelt as the material spells them, in the material's order. */
function stockedColours(material: { colours: readonly string[] } | undefined, wanted: readonly string[]) {
  const asked = new Set(wanted.map(colourKey));
  return (material?.colours ?? []).filter((c) => asked.has(colourKey(c)));
}

/**
 * The colours ticked when a material is chosen: those of the job's own colours it stocks (a job that names
 * none asks for the colours its design names, if any). A job naming no colour at all (one requested from the
 * studio, whose designs give a count) gets every colour of a material that stocks exactly as many as the
 * design is drawn in, the one choice that gives the design all its colours; else none, for the fabricator.
 */
export function coloursToTick(
  material: { colours: readonly string[] } | undefined,
  jobColours: readonly string[],
  design: Pick<DesignView, 'spec'> | undefined,
): string[] {
  const named = jobColours.length > 0 ? jobColours : (design?.spec.colours?.names ?? []);
  if (named.length > 0) return stockedColours(material, named);
  if (!material || !design) return [];
  return material.colours.length === designColours(design).count ? [...material.colours] : [];
}

/** A colour as stock lists compare it: "Amber " and "amber" are one colour. */
const colourKey = (c: string) => c.trim().toLowerCase();

/** How many colours of stock a design is drawn in, and by which rule (one colour: no rule applies). */
export function designColours(design: Pick<DesignView, 'spec'> | undefined): {
  count: number;
  rule: PrepareJobValues['colourRule'];
} {
  const colours = design?.spec.colours;
  return {
    count: colours?.count ?? colours?.names?.length ?? 1,
    rule: colours?.rule ?? 'neighbour-distinct',
  };
}

/**
 * Fewer colours of stock than the design was drawn in: what that does to the cut, said before the fabricator
 * confirms ("The design uses 3 colours (Neighbours differ); with 1 colour every piece is cut from the same
 * stock."). Null when the choice gives the design all its colours.
 */
export function fewerColoursWarning(
  designed: { count: number; rule: PrepareJobValues['colourRule'] },
  chosen: number,
): string | null {
  if (chosen < 1 || chosen >= designed.count) return null;
  const uses = `The design uses ${countOf(designed.count, 'colour')} (${COLOUR_RULE_LABELS[designed.rule]})`;
  return chosen === 1
    ? `${uses}; with 1 colour every piece is cut from the same stock.`
    : `${uses}; with ${countOf(chosen, 'colour')} its pieces are shared among fewer colours, and the rule may not be met.`;
}

/** The fabricator's choices: material, an approved machine profile version, colours and sheet size. */
export function PrepareJobDialog(props: PrepareJobDialogProps) {
  const materials = useMaterials(props.open);
  const profiles = useMachineProfiles(props.open);
  const design = useDesign(props.open ? props.designId : undefined);
  const {
    register,
    control,
    handleSubmit,
    setValue,
    getValues,
    clearErrors,
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
  const chosenColours = useWatch({ control, name: 'colours' });
  const colourWarning = fewerColoursWarning(designColours(design.data), chosenColours.length);
  const profileVersionId = useWatch({ control, name: 'profileVersionId' });
  const allMaterials = materials.data?.items ?? [];
  const allProfiles = profiles.data?.items ?? [];
  const material = allMaterials.find((m) => m.id === materialId);
  // Only approved versions that hold settings for the chosen material (and no laser for a material kept
  // off lasers) can prepare the job.
  const approved = profilesFor(allProfiles, material);
  // The profile chosen before a material change took it off the list: kept to say why, and chosen again
  // when a material it can cut comes back.
  const [dropped, setDropped] = useState<MachineProfileSummaryView | null>(null);
  const chosenProfile = allProfiles.find(
    (p) => p.currentApproved && p.currentApproved.id === profileVersionId,
  );
  // After the render that offers it again (a select takes only a value it has an option for).
  const restorable =
    dropped?.currentApproved && approved.includes(dropped) ? dropped.currentApproved.id : null;
  useEffect(() => {
    if (restorable) {
      setValue('profileVersionId', restorable);
      setDropped(null);
    }
  }, [restorable, setValue]);
  const explanation = explainMaterialAndMachine({
    material,
    intended: chosenProfile ?? dropped ?? undefined,
    profiles: allProfiles,
    materials: allMaterials,
  });
  const fields = { register, errors };
  // The lists that could not be loaded, said in one alert (the service unreachable fails both alike); they are
  // asked again by themselves meanwhile (see refetchWhileFailing).
  const failed = [
    { name: 'materials', query: materials },
    { name: 'machine profiles', query: profiles },
  ].filter((l) => l.query.isError);
  const failedMessages = [...new Set(failed.map((l) => errorMessage(l.query.error)))];

  // A job prepared before opens with its choices, as far as they are still offered: the material, its
  // colours and sheet, the rule, and the profile (its approved version now, if the one used was retired).
  // Once the lists have loaded, and once; the profile is chosen in the render after the material, which
  // offers it (a select takes only a value it has an option for).
  const [prefilled, setPrefilled] = useState(false);
  const [pendingProfile, setPendingProfile] = useState<string | null>(null);
  /** What of the last preparation is not offered any more, said above the fields. */
  const [notOffered, setNotOffered] = useState<string[]>([]);
  const before = props.prepared;
  useEffect(() => {
    if (prefilled || !before || !materials.data || !profiles.data) return;
    setPrefilled(true);
    const m = materials.data.items.find((x) => x.id === before.materialId);
    if (before.colourRule) setValue('colourRule', before.colourRule);
    if (!m) {
      setNotOffered(['The material the job was prepared with is no longer listed: choose one.']);
      return;
    }
    const notes: string[] = [];
    setValue('materialId', m.id);
    const colours = stockedColours(m, props.jobColours ?? []);
    setValue('colours', colours);
    const stocked = new Set(colours.map(colourKey));
    const gone = (props.jobColours ?? []).filter((c) => !stocked.has(colourKey(c)));
    if (gone.length > 0) notes.push(`${m.name} no longer stocks ${gone.join(', ')}.`);
    const sheet = before.sheet ? stockSheetIndex(m.stockSheets, before.sheet) : -1;
    setValue('sheetIndex', String(Math.max(0, sheet)));
    if (before.sheet && sheet < 0 && m.stockSheets.length > 0) {
      notes.push(
        `${m.name} no longer lists ${formatSheetSize(before.sheet, props.unit ?? 'mm')} sheets, the size ` +
          'the job was laid out on: check the sheet below.',
      );
    }
    const offered = profilesFor(profiles.data.items, m);
    const same =
      offered.find((p) => p.currentApproved?.id === before.profileVersionId) ??
      offered.find((p) => p.name === before.profileName);
    if (same?.currentApproved) setPendingProfile(same.currentApproved.id);
    else if (before.profileName) {
      notes.push(`${before.profileName} is not offered for ${m.name} any more: choose a machine profile.`);
    }
    setNotOffered(notes);
  }, [prefilled, before, materials.data, profiles.data, props.jobColours, props.unit, setValue]);
  // A first preparation starts from the design: the colour rule it was drawn with, and the stock and machine
  // it names when exactly one material (and one approved profile of its kind) fits.
  const [fromDesign, setFromDesign] = useState<string | null>(null);
  const designSpec = design.data?.spec;
  useEffect(() => {
    if (prefilled || before || !designSpec || !materials.data || !profiles.data) return;
    setPrefilled(true);
    if (designSpec.colours?.rule) setValue('colourRule', designSpec.colours.rule);
    const found = stockOfDesign(
      designSpec,
      materials.data.items,
      profiles.data.items,
      props.jobColours ?? [],
    );
    const unit = props.unit ?? 'mm';
    if (found.kind === 'none') {
      const drawnFor = `${formatStockThickness(designSpec.stock.thicknessMm, unit)} stock${
        designSpec.stock.sheet ? ` in ${formatSheetSize(designSpec.stock.sheet, unit)} sheets` : ''
      }`;
      setFromDesign(
        `No material on the list is ${drawnFor}${
          designSpec.machine.kind === 'laser' ? ' that may be cut on a laser' : ''
        }, as the design was drawn for: choose a material. Its slots keep the widths drawn for that thickness.`,
      );
      return;
    }
    if (found.kind === 'several') {
      setFromDesign(
        `${found.materials.map((x) => x.name).join(', ')} all keep the design’s stock` +
          (found.stockColours ? ' and stock the colours asked' : '') +
          ': choose one.',
      );
      return;
    }
    const { material: m, sheetIndex, profile } = found;
    setValue('materialId', m.id);
    setValue('colours', coloursToTick(m, props.jobColours ?? [], { spec: designSpec }));
    setValue('sheetIndex', String(sheetIndex));
    if (profile?.currentApproved) setPendingProfile(profile.currentApproved.id);
    const sheet = m.stockSheets[sheetIndex];
    setFromDesign(
      `Chosen from the design’s stock: ${m.name}` +
        (sheet ? `, ${formatSheetSize(sheet, unit)} sheets` : '') +
        (profile ? `, on ${profile.name}` : '') +
        '. Check them before preparing.',
    );
  }, [prefilled, before, designSpec, materials.data, profiles.data, props.jobColours, props.unit, setValue]);
  const offeredNow =
    pendingProfile && approved.some((p) => p.currentApproved?.id === pendingProfile) ? pendingProfile : null;
  useEffect(() => {
    if (offeredNow) {
      setValue('profileVersionId', offeredNow);
      setPendingProfile(null);
    }
  }, [offeredNow, setValue]);

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
  const profileField = register('profileVersionId');
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
      {
        // Until the lists (and the job's design, which a first preparation starts from) are in, the choices
        // shown are not the ones offered: said, so nobody picks from half a list.
        materials.isLoading || profiles.isLoading || design.isLoading ? (
          <LinearProgress aria-label="Loading the materials and machine profiles" sx={{ mb: 1 }} />
        ) : null
      }
      {failed.length > 0 ? (
        <Alert
          severity="error"
          role="alert"
          sx={{ mb: 2 }}
          data-testid="prepare-lists-error"
          action={
            <Button
              color="inherit"
              size="small"
              disabled={failed.some((l) => l.query.isFetching)}
              onClick={() => failed.forEach((l) => void l.query.refetch())}
            >
              Try again
            </Button>
          }
        >
          {`The ${failed.map((l) => l.name).join(' and ')} could not be loaded. ${failedMessages.join(' ')}`}
        </Alert>
      ) : null}
      {fromDesign ? (
        <Alert severity="info" sx={{ mb: 1 }} data-testid="prepare-from-design">
          {fromDesign}
        </Alert>
      ) : null}
      {notOffered.length > 0 ? (
        <Alert severity="info" sx={{ mb: 1 }} data-testid="prepare-not-offered">
          {['Since the job was last prepared:', ...notOffered].join(' ')}
        </Alert>
      ) : null}
      <Stack spacing={2} sx={{ mt: 1 }}>
        <FormTextField
          select
          slotProps={NATIVE_SELECT}
          label="Material"
          registration={{
            ...materialField,
            onChange: async (e) => {
              const next = allMaterials.find((m) => m.id === String(e.target.value));
              // The line saying the design's stock was chosen is no longer true of another material.
              if (next?.id !== getValues('materialId')) setFromDesign(null);
              // The job's own colours come ticked where the new material stocks them (see coloursToTick).
              setValue('colours', coloursToTick(next, props.jobColours ?? [], design.data));
              setValue('sheetIndex', '0');
              // The colours are the new material's to choose: an error about the old one's no longer applies.
              clearErrors('colours');
              // A chosen version not offered for the new material is taken off (the dialog says why); the
              // one taken off earlier is chosen again when the new material suits it.
              const chosen = getValues('profileVersionId');
              const current = allProfiles.find((p) => p.currentApproved && p.currentApproved.id === chosen);
              if (current && !profilesFor(allProfiles, next).includes(current)) {
                setValue('profileVersionId', '');
                setDropped(current);
              }
              return materialField.onChange(e);
            },
          }}
          error={errors.materialId}
        >
          <option value="">Choose…</option>
          {allMaterials.map((m) => (
            <option key={m.id} value={m.id}>
              {`${m.name}${m.laserAllowed ? '' : ' (not for lasers)'}`}
            </option>
          ))}
        </FormTextField>
        {explanation ? (
          <Alert severity={explanation.severity} data-testid="prepare-explanation">
            {explanation.lines.map((line) => (
              <Typography key={line} variant="body2" sx={{ '& + &': { mt: 0.5 } }}>
                {line}
              </Typography>
            ))}
          </Alert>
        ) : null}
        <FormTextField
          select
          slotProps={NATIVE_SELECT}
          label="Machine profile (approved version)"
          registration={{
            ...profileField,
            // Choosing a profile by hand forgets the one a material change took off.
            onChange: async (e) => {
              setDropped(null);
              return profileField.onChange(e);
            },
          }}
          error={errors.profileVersionId}
        >
          <option value="">Choose…</option>
          {approved.map((p) => (
            <option key={p.id} value={p.currentApproved?.id}>
              {`${p.name} · ${kindLabel(p.kind)} · v${p.currentApproved?.number}`}
            </option>
          ))}
        </FormTextField>
        {material ? (
          <>
            <Controller
              control={control}
              name="colours"
              render={({ field }) => (
                <Stack role="group" aria-labelledby="prepare-colours-label">
                  <Typography id="prepare-colours-label" variant="body2" color="text.secondary">
                    Colours of stock
                  </Typography>
                  <Stack direction="row" sx={{ flexWrap: 'wrap' }}>
                    {material.colours.map((c, i) => (
                      <FormControlLabel
                        key={c}
                        label={c}
                        control={
                          <Checkbox
                            // The first colour takes the field's ref: a Prepare with none ticked puts the
                            // keyboard there, by the error, as it does on a field left empty.
                            slotProps={{
                              input: {
                                ...(i === 0 ? { ref: field.ref } : {}),
                                'aria-describedby': errors.colours ? 'prepare-colours-error' : undefined,
                              },
                            }}
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
                  {errors.colours ? (
                    <FormHelperText error id="prepare-colours-error">
                      {errors.colours.message}
                    </FormHelperText>
                  ) : null}
                </Stack>
              )}
            />
            {colourWarning ? (
              <Alert severity="warning" data-testid="prepare-colour-warning">
                {colourWarning}
              </Alert>
            ) : null}
            <NativeSelectField label="Sheet" name="sheetIndex" form={fields}>
              {material.stockSheets.map((s, i) => (
                <option key={i} value={String(i)}>
                  {`${formatSheetSize(s, props.unit ?? 'mm')} · ${formatMoney(s.pricePerSheet, s.currency)}`}
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
