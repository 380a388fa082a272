import { zodResolver } from '@hookform/resolvers/zod';
import { type ColourRuleName, type DesignView, type UploadedSolid } from '@kerfwright/contracts';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import CircularProgress from '@mui/material/CircularProgress';
import MenuItem from '@mui/material/MenuItem';
import Paper from '@mui/material/Paper';
import Snackbar from '@mui/material/Snackbar';
import Stack from '@mui/material/Stack';
import Tab from '@mui/material/Tab';
import Tabs from '@mui/material/Tabs';
import TextField from '@mui/material/TextField';
import ToggleButton from '@mui/material/ToggleButton';
import ToggleButtonGroup from '@mui/material/ToggleButtonGroup';
import Typography from '@mui/material/Typography';
import { useMemo, useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { useNavigate, useParams } from 'react-router-dom';
import { ErrorPanel } from '../../../components/errors/error-panel';
import { FormErrorAlert } from '../../../components/ui/form-error-alert';
import { formatLength, type LengthUnit } from '../../../lib/units';
import { useDuplicateDesign } from '../api/duplicate-design';
import { useDesign } from '../api/get-design';
import { useRequestCutJob } from '../api/request-cut-job';
import { useSaveDesign } from '../api/save-design';
import { CrossingTable } from '../components/crossing-table';
import {
  DEFAULT_DESIGN_VALUES,
  type DesignFormValues,
  designFormSchema,
  fromDesign,
  toDesignSpec,
} from '../components/design-form-schema';
import { ModelPreview3d } from '../components/model-preview-3d';
import { PieceView2d } from '../components/piece-view-2d';
import { ReportIssues } from '../components/report-issues';
import { RequestJobDialog, type RequestJobValues } from '../components/request-job-dialog';
import { SpecForm } from '../components/spec-form';
import { useBuiltModel } from '../hooks/use-built-model';

/** /designs/new and /designs/:designId: the studio, loading the saved design first when there is one. */
export function DesignStudioRoute() {
  const { designId } = useParams();
  const design = useDesign(designId);
  if (designId && design.isPending) {
    return (
      <Box sx={{ display: 'grid', placeItems: 'center', minHeight: 240 }}>
        <CircularProgress aria-label="Loading the design" />
      </Box>
    );
  }
  if (designId && design.isError) {
    return (
      <ErrorPanel
        title="The design could not be loaded"
        error={design.error}
        onRetry={() => void design.refetch()}
      />
    );
  }
  // A new key per design resets the form when the address changes (e.g. after Duplicate).
  return <DesignStudio key={design.data?.id ?? 'new'} design={design.data ?? null} />;
}

function DesignStudio({ design }: { design: DesignView | null }) {
  const navigate = useNavigate();
  const initial = useMemo(
    () => (design ? fromDesign(design) : { values: DEFAULT_DESIGN_VALUES, upload: null }),
    [design],
  );
  const form = useForm<DesignFormValues>({
    resolver: zodResolver(designFormSchema),
    mode: 'onChange',
    defaultValues: initial.values,
  });
  const [upload, setUpload] = useState<UploadedSolid | null>(initial.upload);
  const [unit, setUnit] = useState<LengthUnit>('mm');
  const [tab, setTab] = useState(0);
  const [selected, setSelected] = useState<string | undefined>(undefined);
  const [requestOpen, setRequestOpen] = useState(false);
  const [notice, setNotice] = useState<string | null>(null);
  const saveDesign = useSaveDesign();
  const duplicate = useDuplicateDesign();
  const requestJob = useRequestCutJob();

  const values = useWatch({ control: form.control }) as DesignFormValues;
  const parsed = designFormSchema.safeParse(values);
  const spec = useMemo(
    () => (parsed.success ? toDesignSpec(parsed.data, upload) : null),
    // The parsed values are compared by content so an unchanged form does not rebuild the model.
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [JSON.stringify(parsed.success ? parsed.data : null), upload],
  );
  const colourCount = parsed.success ? parsed.data.colourCount : 1;
  const colourRule: ColourRuleName = parsed.success ? parsed.data.colourRule : 'neighbour-distinct';
  const preview = useBuiltModel(spec, colourCount, colourRule);
  const report = preview.model?.report ?? null;
  const fmt = (mm: number) => formatLength(mm, unit);
  const piece = report?.pieces.find((p) => p.id === selected) ?? report?.pieces[0];
  const flaggedPieces = useMemo(
    () => new Set([...(report?.errors ?? []), ...(report?.warnings ?? [])].flatMap((i) => i.pieces)),
    [report],
  );

  const save = form.handleSubmit(async (v) => {
    const body = toDesignSpec(v, upload);
    if (!body) {
      setNotice('Upload a solid file first.');
      return;
    }
    const saved = await saveDesign
      .mutateAsync(
        design
          ? {
              id: design.id,
              body: { name: v.name, description: v.description, spec: body, version: design.version },
            }
          : { body: { name: v.name, description: v.description, spec: body } },
      )
      .catch(() => null);
    if (!saved) return;
    setNotice(`Saved “${saved.name}”.`);
    if (!design) void navigate(`/designs/${saved.id}`, { replace: true });
  });

  const onDuplicate = async () => {
    if (!design) return;
    const copy = await duplicate.mutateAsync(design.id).catch(() => null);
    if (copy) {
      setNotice(`Made a copy: “${copy.name}”.`);
      void navigate(`/designs/${copy.id}`);
    }
  };

  const onRequest = async (v: RequestJobValues) => {
    if (!design) return;
    const job = await requestJob.mutateAsync({ designId: design.id, ...v }).catch(() => null);
    if (job) void navigate(`/jobs/${job.id}`);
  };

  const dirty = form.formState.isDirty || upload !== initial.upload;

  return (
    <Box data-testid="design-studio">
      <title>{`${design?.name ?? 'New design'} · Design studio · Kerfwright`}</title>
      <Stack direction={{ xs: 'column', md: 'row' }} spacing={2} sx={{ mb: 2, alignItems: { md: 'center' } }}>
        <Box sx={{ flex: 1 }}>
          <Typography variant="h1">Design studio</Typography>
          <Typography color="text.secondary">
            {design ? `${design.name} · version ${design.version} · by ${design.ownerName}` : 'A new design'}
          </Typography>
        </Box>
        <ToggleButtonGroup
          size="small"
          exclusive
          value={unit}
          onChange={(_, u: LengthUnit | null) => u && setUnit(u)}
          aria-label="Units"
        >
          <ToggleButton value="mm">mm</ToggleButton>
          <ToggleButton value="in">inch</ToggleButton>
        </ToggleButtonGroup>
        <Button variant="contained" onClick={() => void save()} disabled={saveDesign.isPending}>
          {design ? 'Save' : 'Save design'}
        </Button>
        {design ? (
          <>
            <Button variant="outlined" onClick={() => void onDuplicate()} disabled={duplicate.isPending}>
              Duplicate
            </Button>
            <Button
              variant="outlined"
              color="secondary"
              disabled={dirty || !report || report.errors.length > 0}
              title={dirty ? 'Save the changes first' : undefined}
              onClick={() => {
                requestJob.reset();
                setRequestOpen(true);
              }}
            >
              Request a cut job
            </Button>
          </>
        ) : null}
      </Stack>
      {saveDesign.error ? <FormErrorAlert error={saveDesign.error} /> : null}
      {duplicate.error ? <FormErrorAlert error={duplicate.error} /> : null}

      <Box sx={{ display: 'grid', gap: 2, gridTemplateColumns: { xs: '1fr', lg: '380px 1fr' } }}>
        <Paper variant="outlined" sx={{ p: 2, alignSelf: 'start' }}>
          <SpecForm
            form={form}
            upload={upload}
            onUpload={setUpload}
            suggestedSizes={report?.suggestedSizes ?? null}
          />
        </Paper>

        <Stack spacing={2} sx={{ minWidth: 0 }}>
          <Paper variant="outlined" sx={{ p: 2 }}>
            {report ? (
              <>
                <Stack
                  direction="row"
                  spacing={3}
                  sx={{ mb: 1, flexWrap: 'wrap' }}
                  useFlexGap
                  data-testid="model-facts"
                >
                  <Fact label="Solid" value={report.solid.name} />
                  <Fact label="Pieces" value={String(report.pieces.length)} />
                  <Fact label="Crossings" value={String(report.crossings.length)} />
                  <Fact label="Diameter" value={fmt(report.diameterMm)} />
                  <Fact label="Plane distance" value={fmt(report.planeDistanceMm)} />
                  <Fact label="Built in" value={`${preview.buildMs.toFixed(0)} ms`} />
                </Stack>
                {preview.colourMessage ? (
                  <Alert severity="warning" sx={{ mb: 1 }}>
                    {preview.colourMessage}
                  </Alert>
                ) : null}
                <Box sx={{ height: 420 }}>
                  <ModelPreview3d
                    report={report}
                    pieceColours={preview.pieceColour}
                    modelKey={preview.key}
                    selectedPiece={piece?.id}
                    onSelectPiece={setSelected}
                  />
                </Box>
              </>
            ) : (
              <Alert severity={preview.failure ? 'error' : 'info'} data-testid="preview-unavailable">
                {preview.failure ??
                  (values.solidSource === 'upload' && !upload
                    ? 'Drop an OBJ or OFF file of a convex solid to see the model.'
                    : 'Correct the marked fields to see the model.')}
              </Alert>
            )}
          </Paper>

          {report ? (
            <Paper variant="outlined" sx={{ p: 2 }}>
              <Tabs value={tab} onChange={(_, t: number) => setTab(t)} sx={{ mb: 2 }}>
                <Tab label="Piece" />
                <Tab label={`Crossings (${report.crossings.length})`} />
                <Tab label={`Report (${report.errors.length} errors, ${report.warnings.length} warnings)`} />
              </Tabs>
              {tab === 0 && piece ? (
                <Stack spacing={1}>
                  <TextField
                    select
                    size="small"
                    label="Piece"
                    value={piece.id}
                    onChange={(e) => setSelected(e.target.value)}
                    sx={{ maxWidth: 200 }}
                  >
                    {report.pieces.map((p) => (
                      <MenuItem key={p.id} value={p.id}>
                        {p.id}
                      </MenuItem>
                    ))}
                  </TextField>
                  <PieceView2d
                    piece={piece}
                    colourIndex={preview.pieceColour[piece.id]}
                    flagged={flaggedPieces.has(piece.id)}
                    formatLength={fmt}
                  />
                  <ReportIssues
                    errors={report.errors.filter((i) => i.pieces.includes(piece.id))}
                    warnings={report.warnings.filter((i) => i.pieces.includes(piece.id))}
                    onSelectPiece={setSelected}
                    limit={4}
                  />
                  <CrossingTable crossings={report.crossings} pieceId={piece.id} formatLength={fmt} />
                </Stack>
              ) : null}
              {tab === 1 ? <CrossingTable crossings={report.crossings} formatLength={fmt} /> : null}
              {tab === 2 ? (
                <ReportIssues
                  errors={report.errors}
                  warnings={report.warnings}
                  onSelectPiece={(id) => {
                    setSelected(id);
                    setTab(0);
                  }}
                />
              ) : null}
            </Paper>
          ) : null}
        </Stack>
      </Box>

      <RequestJobDialog
        open={requestOpen}
        busy={requestJob.isPending}
        error={requestJob.error}
        onSubmit={(v) => void onRequest(v)}
        onClose={() => setRequestOpen(false)}
      />
      <Snackbar
        open={notice !== null}
        autoHideDuration={4000}
        onClose={() => setNotice(null)}
        message={notice ?? ''}
        anchorOrigin={{ vertical: 'bottom', horizontal: 'center' }}
      />
    </Box>
  );
}

function Fact({ label, value }: { label: string; value: string }) {
  return (
    <Box>
      <Typography variant="caption" color="text.secondary" component="div">
        {label}
      </Typography>
      <Typography variant="body2" sx={{ fontWeight: 500 }}>
        {value}
      </Typography>
    </Box>
  );
}
