import {
  type DesignSpecInput,
  type MachineKind,
  type MachineProfileKind,
  type MaterialView,
  geometryMachineKind,
  pricedSheet,
} from '@kerfwright/contracts';
import { type ColourRule, FIT_SHEETS_TOLERANCE } from '@kerfwright/geometry';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import LinearProgress from '@mui/material/LinearProgress';
import Paper from '@mui/material/Paper';
import Stack from '@mui/material/Stack';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import { memo, useMemo, useState } from 'react';
import { type LengthUnit, formatLength, formatSheetSize, formatStockThickness } from '../../../lib/units';
import { SheetLayoutView } from '../../layout/components/sheet-layout-view';
import { estimateSheets } from '../../layout/lib/estimate-sheets';
import { useLayoutTask } from '../../layout/hooks/use-layout-task';
import { useMachineProfiles } from '../../jobs/api/get-machine-profiles';
import { useMaterials } from '../../jobs/api/get-materials';
import { type BuiltPreview } from '../lib/build-preview';
import { type StudioFit } from '../hooks/use-studio-preview';
import { type StudioSheets } from '../lib/studio-layout';
import { countOf } from '../../../lib/plural';
import { colourPlanSentence } from './colour-plan-notice';
import { keepsStock } from './stock-sheet-picker';
import { NATIVE_SELECT } from '../../../components/ui/native-select-field';

/**
 * The line above the sheets: the size and sheet count, or what the layout could not do. A fit is a search that
 * stops within FIT_SHEETS_TOLERANCE of the size, and nesting is not strictly monotone, so the line says so:
 * one sheet more can even come out a little smaller (325.0 mm on 3 sheets after 325.3 mm on 2).
 */
export function sheetsSummary(value: StudioSheets, fmt: (mm: number) => string): string {
  const size = fmt(value.diameterMm);
  if (value.sheetsAsked !== null)
    return value.sheets.length > 0
      ? `Largest size on ${countOf(value.sheetsAsked, 'sheet')}: diameter ${size}, using ${countOf(value.sheets.length, 'sheet')} ` +
          `(found by a search to within ${FIT_SHEETS_TOLERANCE * 100} %: one sheet more can even come out slightly smaller).`
      : // The search's own sentence (why no size fits) follows as the failure; the model shown is the last tried.
        `No size fits ${countOf(value.sheetsAsked, 'sheet')}; the model shown is the last size tried, ${size} across.`;
  return value.sheets.length > 0
    ? `At diameter ${size} the pieces need ${countOf(value.sheets.length, 'sheet')}.`
    : `The pieces could not be laid out at diameter ${size}.`;
}

/**
 * What the layout or the fit could not do, for the page: the engine's "no plan exists: rule "…" cannot be met
 * with k colours; it needs at least m" names the rule as the form does; other reasons become sentences.
 */
export function failureSentence(failure: string): string {
  if (!/^no plan exists/i.test(failure)) {
    // The engine writes its reasons as clauses ("no size fits 1 sheet …"): a sentence here.
    const sentence = failure.charAt(0).toUpperCase() + failure.slice(1);
    return /[.!?]$/.test(sentence) ? sentence : `${sentence}.`;
  }
  const fewest = Number(/needs at least (\d+)/.exec(failure)?.[1]);
  return colourPlanSentence(failure, Number.isInteger(fewest) && fewest > 0 ? fewest : null);
}

/** A material within this of the design's stock thickness is taken as that thickness (mm). */
const THICKNESS_MATCH_MM = 0.1;

/**
 * A material's thickness (measured, else nominal) and whether it is the design's stock thickness, within
 * THICKNESS_MATCH_MM; an unknown material or design thickness counts as matching (nothing to warn of).
 */
export function materialThickness(
  materials: readonly Pick<MaterialView, 'id' | 'nominalThicknessMm' | 'measuredThicknessMm'>[],
  materialId: string,
  designThicknessMm: number | null,
): { thicknessMm: number | null; matches: boolean } {
  const m = materials.find((x) => x.id === materialId);
  const t = m ? (m.measuredThicknessMm ?? m.nominalThicknessMm) : null;
  return {
    thicknessMm: t,
    matches:
      t === null || designThicknessMm === null || Math.abs(t - designThicknessMm) <= THICKNESS_MATCH_MM,
  };
}

/**
 * The machine the estimate takes until the reader picks one. First the stock the design's fields name (its
 * sheet size at its thickness, as the studio's stock picker shows it), then any stock sold as the design's
 * thickness; within each, a profile of the design's own machine kind (a laser design is cut by a beam or
 * blade, a router design by a bit) before another. None when no stock matches.
 */
export function defaultEstimateChoice<C extends { profileKind: MachineProfileKind; materialId: string }>(
  choices: readonly C[],
  designKind: MachineKind | null,
  soldAs: (materialId: string) => boolean,
  namedStock: (materialId: string) => boolean = () => false,
): C | undefined {
  const ownKind = (c: C) => designKind !== null && geometryMachineKind(c.profileKind) === designKind;
  for (const matches of [namedStock, soldAs]) {
    const matching = choices.filter((c) => matches(c.materialId));
    const found = matching.find(ownKind) ?? matching[0];
    if (found) return found;
  }
  return undefined;
}

/**
 * Whether a material is the stock the design's fields name: the one its stock picker shows (`shown`), or,
 * with none shown, any that keeps the fields' sheet at their thickness.
 */
export function namedStockOf(
  shown: string | null,
  materials: readonly Pick<
    MaterialView,
    'id' | 'stockSheets' | 'nominalThicknessMm' | 'measuredThicknessMm'
  >[],
  fields: { sheetWidthMm: number; sheetHeightMm: number; thicknessMm: number } | null,
): (materialId: string) => boolean {
  return (materialId) => {
    if (shown !== null) return materialId === shown;
    const m = materials.find((x) => x.id === materialId);
    return m !== undefined && fields !== null && keepsStock(m, fields);
  };
}

export const StudioSheetsPanel = memo(function StudioSheetsPanel({
  spec,
  preview,
  fit,
  blocked,
  colourCount,
  colourRule,
  unit,
  stockMaterialId = null,
}: {
  /** The material of the workshop stock the form shows (its stock picker), if any: the estimate takes it. */
  stockMaterialId?: string | null;
  /** The studio's spec (a "fit to sheets" spec as it is, not the preview's fitted one). */
  spec: DesignSpecInput | null;
  preview: BuiltPreview;
  /** "Fit to sheets": the studio's search, whose answer this panel shows; null for the other scales. */
  fit: StudioFit | null;
  /** Why no sheets can be laid out now (the form's first error), or null. */
  blocked: string | null;
  colourCount: number;
  colourRule: ColourRule;
  unit: LengthUnit;
}) {
  const [asked, setAsked] = useState(false);
  const fitting = fit !== null;
  // A fixed size is laid out as the preview built it; a fit is the search for the spec as given.
  const layoutSpec = fitting ? spec : preview.spec;
  // Sheets are laid out per colour: a colour rule the count cannot meet leaves nothing to lay out, and the
  // layout's own failure would only repeat it in the words of the engine.
  const colourProblem =
    preview.colourMessage === null
      ? null
      : preview.colourFewest !== null
        ? `the colour rule needs at least ${countOf(preview.colourFewest, 'colour')}, not ${colourCount}: change the colours (see the preview) to lay the pieces out`
        : `${preview.colourMessage}: change the colours or the rule to lay the pieces out`;
  const on =
    blocked === null &&
    colourProblem === null &&
    layoutSpec !== null &&
    (fitting || (asked && preview.report !== null && !preview.failure));
  // The preview's key names the spec, colours and rule the preview was built from. A fit's layout is the
  // studio's search itself (its answer sized the preview), so this panel runs none of its own then.
  const own = useLayoutTask(
    on && !fitting ? preview.key : null,
    'studio',
    () => [layoutSpec as DesignSpecInput, colourCount, colourRule, preview.colourPlan],
    150,
  );
  const result = fit ? { value: fit.result, pending: fit.pending, error: fit.error } : own;
  const fmt = (mm: number) => formatLength(mm, unit);
  const value = result.value;
  const sheet = (layoutSpec ?? spec)?.stock.sheet;
  const fitLabel = fit ? `Fitting the largest size on ${countOf(fit.sheets, 'sheet')}…` : null;
  // Time and cost need a machine: any approved profile version, with its settings for a material.
  const profiles = useMachineProfiles(on);
  const materials = useMaterials(on);
  // Null until the reader picks: then a machine of the design's kind with a material of its thickness is taken
  // (see defaultEstimateChoice), so that a layout shows its time and cost at once ("no machine" stays one pick
  // away).
  const [machineChoice, setMachineChoice] = useState<string | null>(null);
  // Materials of the design's thickness first: another thickness has other speeds, and the slots would not fit.
  const designThicknessMm = (layoutSpec ?? spec)?.stock.thicknessMm ?? null;
  const thickness = (materialId: string) =>
    materialThickness(materials.data?.items ?? [], materialId, designThicknessMm);
  const choices = useMemo(
    () =>
      (profiles.data?.items ?? [])
        .flatMap((p) =>
          p.currentApproved
            ? p.currentApproved.settings.map((st) => ({
                key: `${p.currentApproved?.id}/${st.materialId}`,
                label: `${p.name} v${p.currentApproved?.number} · ${st.materialName}`,
                profileKind: p.kind,
                materialId: st.materialId,
                version: p.currentApproved,
                setting: st,
              }))
            : [],
        )
        .sort(
          (a, b) =>
            Number(thickness(b.setting.materialId).matches) - Number(thickness(a.setting.materialId).matches),
        ),
    // eslint-disable-next-line react-hooks/exhaustive-deps -- thickness reads the two below
    [profiles.data, materials.data, designThicknessMm],
  );
  // Stock sold as the design's thickness counts, though it measures a little under (3 mm acrylic at 2.85).
  const soldAs = (materialId: string) => {
    const m = materials.data?.items.find((x) => x.id === materialId);
    return (
      m !== undefined &&
      designThicknessMm !== null &&
      [m.nominalThicknessMm, m.measuredThicknessMm].some(
        (t) => t != null && Math.abs(t - designThicknessMm) <= THICKNESS_MATCH_MM,
      )
    );
  };
  const namedStock = namedStockOf(
    stockMaterialId,
    materials.data?.items ?? [],
    sheet && designThicknessMm !== null
      ? { sheetWidthMm: sheet.widthMm, sheetHeightMm: sheet.heightMm, thicknessMm: designThicknessMm }
      : null,
  );
  const designKind = (layoutSpec ?? spec)?.machine.kind ?? null;
  const choiceKey =
    machineChoice ?? defaultEstimateChoice(choices, designKind, soldAs, namedStock)?.key ?? '';
  const choice = choices.find((c) => c.key === choiceKey);
  const chosen = choice ? thickness(choice.setting.materialId) : null;
  const thicknessWarning =
    choice && chosen && !chosen.matches && chosen.thicknessMm !== null && designThicknessMm !== null
      ? `${choice.setting.materialName} is ${formatStockThickness(chosen.thicknessMm, unit)} thick, but this design is for ` +
        `${formatStockThickness(designThicknessMm, unit)} stock: its slots would not fit that material, and the estimate uses its speeds.`
      : null;
  const estimate = useMemo(() => {
    const drawnFor = (layoutSpec ?? spec)?.machine;
    if (!choice?.version || !value || value.sheets.length === 0 || !sheet || !drawnFor) return null;
    const material = materials.data?.items.find((m) => m.id === choice.setting.materialId);
    // Priced as preparation prices it: the listed size either way round, in the machine's currency.
    const price = material ? pricedSheet(material, sheet, choice.version.currency) : null;
    return estimateSheets(value.sheets, choice.version, choice.setting, price, drawnFor);
  }, [choice, value, sheet, materials.data, layoutSpec, spec]);
  return (
    <Paper variant="outlined" sx={{ p: 2 }} data-testid="studio-sheets">
      <Stack direction="row" sx={{ alignItems: 'center', mb: 1 }} spacing={2}>
        <Typography variant="h2" sx={{ flex: 1 }}>
          Sheets
        </Typography>
        {!fitting ? (
          <Button variant="outlined" onClick={() => setAsked((a) => !a)}>
            {asked ? 'Hide the sheets' : 'Lay out on sheets'}
          </Button>
        ) : null}
      </Stack>
      {!on ? (
        <Typography color="text.secondary" data-testid="sheets-idle">
          {blocked !== null
            ? `Correct the marked fields to lay the pieces out: ${blocked}.`
            : colourProblem !== null
              ? `No sheets yet: ${colourProblem}.`
              : asked && preview.failure
                ? 'The pieces can be laid out once the model builds.'
                : sheet
                  ? `Lay the pieces out on ${formatSheetSize(sheet, unit)} sheets to see how many this size needs.`
                  : 'Give a stock sheet size to lay the pieces out.'}
        </Typography>
      ) : null}
      {on && result.pending ? (
        <>
          {fitLabel ? (
            <Typography color="text.secondary" sx={{ mb: 1 }} data-testid="sheets-fitting">
              {fitLabel}
            </Typography>
          ) : null}
          <LinearProgress aria-label={fitLabel ?? 'Laying out the sheets'} sx={{ mb: 1 }} />
        </>
      ) : null}
      {on && result.error ? (
        <Alert severity="error">
          {result.error instanceof Error ? result.error.message : String(result.error)}
        </Alert>
      ) : null}
      {on && value && !(result.pending && value.sheets.length === 0) ? (
        // While a newer layout or fit runs, the last sheets stay in view, dimmed and marked busy; a last answer
        // that laid nothing out is not shown at all: its reason ("cannot be met with 2 colours") is about
        // the values before the edit that started the new one.
        <Box
          sx={{ opacity: result.pending ? 0.55 : 1 }}
          aria-busy={result.pending || undefined}
          data-testid="sheets-result"
        >
          <Typography sx={{ mb: 1 }} data-testid="sheets-summary">
            {sheetsSummary(value, fmt)}
          </Typography>
          {value.failure ? (
            <Alert severity="error" sx={{ mb: 1 }}>
              {failureSentence(value.failure)}
            </Alert>
          ) : null}
          {choices.length > 0 && value.sheets.length > 0 ? (
            <TextField
              select
              size="small"
              label="Estimate time and cost with"
              value={choiceKey}
              onChange={(e) => setMachineChoice(e.target.value)}
              slotProps={NATIVE_SELECT}
              sx={{ mb: 2, minWidth: 320 }}
            >
              <option value="">no machine (cut length and pierces only)</option>
              {choices.map((c) => (
                <option key={c.key} value={c.key}>
                  {c.label}
                </option>
              ))}
            </TextField>
          ) : null}
          {thicknessWarning ? (
            <Alert severity="warning" sx={{ mb: 1 }} data-testid="estimate-thickness">
              {thicknessWarning}
            </Alert>
          ) : null}
          {value.sheets.length > 0 ? (
            <SheetLayoutView sheets={value.sheets} unit={unit} estimate={estimate} />
          ) : null}
          {estimate ? (
            <Typography variant="body2" color="text.secondary" sx={{ mt: 1 }}>
              Estimated without label marking, at the approved version&apos;s speeds and hourly rate. A
              job&apos;s figures follow what its preparation chooses (stock, sheet, colours, copies, labels),
              so they can differ from these.
            </Typography>
          ) : null}
        </Box>
      ) : null}
    </Paper>
  );
});
