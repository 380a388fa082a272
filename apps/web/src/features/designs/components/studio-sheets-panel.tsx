import { type DesignSpecInput } from '@kerfwright/contracts';
import { type ColourRule } from '@kerfwright/geometry';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import LinearProgress from '@mui/material/LinearProgress';
import Paper from '@mui/material/Paper';
import Stack from '@mui/material/Stack';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import { memo, useMemo, useState } from 'react';
import { type LengthUnit, formatLength } from '../../../lib/units';
import { SheetLayoutView } from '../../layout/components/sheet-layout-view';
import { estimateSheets } from '../../layout/lib/estimate-sheets';
import { useLayoutTask } from '../../layout/hooks/use-layout-task';
import { useMachineProfiles } from '../../jobs/api/get-machine-profiles';
import { useMaterials } from '../../jobs/api/get-materials';
import { type BuiltPreview } from '../hooks/use-built-model';
import { type StudioSheets } from '../lib/studio-layout';
import { countOf } from '../../../lib/plural';
import { NATIVE_SELECT } from '../../../components/ui/native-select-field';

/** The line above the sheets: the size and sheet count, or what the layout could not do. */
function sheetsSummary(value: StudioSheets, fmt: (mm: number) => string): string {
  const size = fmt(value.diameterMm);
  if (value.sheetsAsked !== null)
    return value.sheets.length > 0
      ? `Largest size on ${countOf(value.sheetsAsked, 'sheet')}: diameter ${size}, using ${value.sheets.length}.`
      : `No size found on ${countOf(value.sheetsAsked, 'sheet')}: the search stopped at diameter ${size}.`;
  return value.sheets.length > 0
    ? `At diameter ${size} the pieces need ${countOf(value.sheets.length, 'sheet')}.`
    : `The pieces could not be laid out at diameter ${size}.`;
}

export const StudioSheetsPanel = memo(function StudioSheetsPanel({
  preview,
  colourCount,
  colourRule,
  unit,
}: {
  preview: BuiltPreview;
  colourCount: number;
  colourRule: ColourRule;
  unit: LengthUnit;
}) {
  const [asked, setAsked] = useState(false);
  const spec = preview.spec;
  const fit = spec?.scale.by === 'fitSheets';
  const on = (asked || fit) && spec !== null && preview.model !== null && !preview.failure;
  // The preview's key names the spec, colours and rule the preview was built from.
  const result = useLayoutTask(
    on ? preview.key : null,
    'studio',
    () => [spec as DesignSpecInput, colourCount, colourRule, preview.colourPlan],
    150,
  );
  const fmt = (mm: number) => formatLength(mm, unit);
  const value = result.value;
  const sheet = spec?.stock.sheet;
  // Time and cost need a machine: any approved profile version, with its settings for a material.
  const profiles = useMachineProfiles(on);
  const materials = useMaterials(on);
  const [machineChoice, setMachineChoice] = useState('');
  const choices = useMemo(
    () =>
      (profiles.data?.items ?? []).flatMap((p) =>
        p.currentApproved
          ? p.currentApproved.settings.map((st) => ({
              key: `${p.currentApproved?.id}/${st.materialId}`,
              label: `${p.name} v${p.currentApproved?.number} · ${st.materialName}`,
              version: p.currentApproved,
              setting: st,
            }))
          : [],
      ),
    [profiles.data],
  );
  const choice = choices.find((c) => c.key === machineChoice);
  const estimate = useMemo(() => {
    if (!choice?.version || !value || value.sheets.length === 0 || !sheet) return null;
    const material = materials.data?.items.find((m) => m.id === choice.setting.materialId);
    const stock = material?.stockSheets.find(
      (sh) => sh.widthMm === sheet.widthMm && sh.heightMm === sheet.heightMm,
    );
    return estimateSheets(value.sheets, choice.version, choice.setting, stock ? stock.pricePerSheet : null);
  }, [choice, value, sheet, materials.data]);
  return (
    <Paper variant="outlined" sx={{ p: 2 }} data-testid="studio-sheets">
      <Stack direction="row" sx={{ alignItems: 'center', mb: 1 }} spacing={2}>
        <Typography variant="h2" sx={{ flex: 1 }}>
          Sheets
        </Typography>
        {!fit ? (
          <Button variant="outlined" onClick={() => setAsked((a) => !a)}>
            {asked ? 'Hide the sheets' : 'Lay out on sheets'}
          </Button>
        ) : null}
      </Stack>
      {!on ? (
        <Typography color="text.secondary">
          {sheet
            ? `Lay the pieces out on ${fmt(sheet.widthMm)} × ${fmt(sheet.heightMm)} sheets to see how many this size needs.`
            : 'Give a stock sheet size to lay the pieces out.'}
        </Typography>
      ) : null}
      {on && result.pending ? <LinearProgress aria-label="Laying out the sheets" sx={{ mb: 1 }} /> : null}
      {on && result.error ? (
        <Alert severity="error">
          {result.error instanceof Error ? result.error.message : String(result.error)}
        </Alert>
      ) : null}
      {on && value ? (
        <>
          <Typography sx={{ mb: 1 }} data-testid="sheets-summary">
            {sheetsSummary(value, fmt)}
          </Typography>
          {value.failure ? (
            <Alert severity="error" sx={{ mb: 1 }}>
              {value.failure}
            </Alert>
          ) : null}
          {choices.length > 0 && value.sheets.length > 0 ? (
            <TextField
              select
              size="small"
              label="Estimate time and cost with"
              value={machineChoice}
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
          {value.sheets.length > 0 ? (
            <SheetLayoutView sheets={value.sheets} unit={unit} estimate={estimate} />
          ) : null}
          {estimate ? (
            <Typography variant="body2" color="text.secondary" sx={{ mt: 1 }}>
              Estimated without label marking, at the approved version&apos;s speeds and hourly rate.
            </Typography>
          ) : null}
        </>
      ) : null}
    </Paper>
  );
});
