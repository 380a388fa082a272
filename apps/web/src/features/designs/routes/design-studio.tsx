import { zodResolver } from '@hookform/resolvers/zod';
import {
  type ColourRuleName,
  type DesignReport,
  type DesignView,
  type JobView,
  type UploadedSolid,
} from '@kerfwright/contracts';
import Box from '@mui/material/Box';
import CircularProgress from '@mui/material/CircularProgress';
import Paper from '@mui/material/Paper';
import Stack from '@mui/material/Stack';
import { memo, useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { useLocation, useNavigate, useParams } from 'react-router-dom';
import { ErrorPanel } from '../../../components/errors/error-panel';
import { NotFoundPage } from '../../../components/errors/not-found-page';
import { FormErrorAlert } from '../../../components/ui/form-error-alert';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { paths } from '../../../config/paths';
import { isApiError } from '../../../lib/api-client';
import { formatLength } from '../../../lib/units';
import { useLengthUnit } from '../../../lib/use-length-unit';
import { useDelayedFlag } from '../../../lib/use-delayed-flag';
import { useStableCallback } from '../../../lib/use-stable-callback';
import { useDuplicateDesign } from '../api/duplicate-design';
import { useDesign } from '../api/get-design';
import { DraftKeptError, useRequestCutJob } from '../api/request-cut-job';
import { useSaveDesign } from '../api/save-design';
import {
  DEFAULT_DESIGN_VALUES,
  type DesignFormValues,
  describeFormIssue,
  designFormSchema,
  fromDesign,
  toDesignSpec,
  toSavedSpec,
} from '../components/design-form-schema';
import { DuplicateDialog } from '../components/duplicate-dialog';
import { RequestJobDialog, type RequestJobValues } from '../../jobs/components/request-job-dialog';
import { SpecForm } from '../components/spec-form';
import { REQUEST_WAITS_FOR_FIT, REQUEST_WAITS_FOR_PREVIEW, StudioHeader } from '../components/studio-header';
import { StudioDetailsPanel } from '../components/studio-details-panel';
import {
  BUILDING_NOTICE_DELAY_MS,
  StudioPreviewPanel,
  unfittedNote,
} from '../components/studio-preview-panel';
import { StudioSheetsPanel } from '../components/studio-sheets-panel';
import { useStudioPreview } from '../hooks/use-studio-preview';
import { useUnsavedChangesGuard } from '../hooks/use-unsaved-changes-guard';
import { countOf } from '../../../lib/plural';
import { NoticeSnackbar } from '../../../components/ui/notice-snackbar';
import { useUser } from '../../../lib/auth';
import { isRecordId } from '../../../lib/record-id';

const RequestJobDialogMemo = memo(RequestJobDialog);

/** /designs/new and /designs/:designId: the studio, loading the saved design first when there is one. */
export function DesignStudioRoute() {
  const { designId } = useParams();
  // An address whose id is no design id names no design: it is not asked for (the API would refuse it).
  const askable = designId === undefined || isRecordId(designId);
  const design = useDesign(askable ? designId : undefined);
  if (designId && (!askable || (isApiError(design.error) && design.error.status === 404))) {
    return <NoSuchDesign />;
  }
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

/**
 * An address that names no design (mistyped, or another member's): say so, and offer the way back,
 * as the job page does for a job. Trying again would only ask the same question.
 */
function NoSuchDesign() {
  return (
    <NotFoundPage
      title="No such design"
      backTo={paths.designs.getHref()}
      backLabel="Back to the designs"
      testId="no-such-design"
    >
      There is no design at this address that you can open. The link may be mistyped or incomplete; the
      designs page lists every design you can open.
    </NotFoundPage>
  );
}

/** What the studio says on opening a design: set by the page that sent the member here (e.g. a new copy). */
interface StudioLocationState {
  notice?: string;
  /** The member saved a new design with the keyboard on Save: it is put back there on its own page. */
  focusSave?: boolean;
}

function DesignStudio({ design }: { design: DesignView | null }) {
  const navigate = useNavigate();
  const user = useUser();
  const location = useLocation();
  const initial = useMemo(
    () => (design ? fromDesign(design) : { values: DEFAULT_DESIGN_VALUES, upload: null }),
    [design],
  );
  const form = useForm<DesignFormValues>({
    resolver: zodResolver(designFormSchema),
    mode: 'onChange',
    defaultValues: initial.values,
  });
  // A design saved under older rules may not pass today's: mark its fields at once, not on the first edit.
  useEffect(() => {
    if (!designFormSchema.safeParse(initial.values).success) void form.trigger();
  }, [form, initial.values]);
  // Sheets and colours are checked together (one sheet per colour): a change of either, or of the scale, marks
  // both fields at once, not only the one typed into.
  useEffect(() => {
    const subscription = form.watch((_, { name }) => {
      if (name === 'scaleBy' || name === 'colourCount' || name === 'fitSheets')
        void form.trigger(['fitSheets', 'colourCount']);
    });
    return () => subscription.unsubscribe();
  }, [form]);
  const [upload, setUpload] = useState<UploadedSolid | null>(initial.upload);
  // The upload as last saved (or loaded): a change of it is an unsaved edit.
  const [savedUpload, setSavedUpload] = useState<UploadedSolid | null>(initial.upload);
  const [unit, setUnit] = useLengthUnit();
  // The material of the workshop stock the form shows: the estimate takes the same stock.
  const [stockMaterialId, setStockMaterialId] = useState<string | null>(null);
  const [tab, setTab] = useState(0);
  const [selected, setSelected] = useState<string | undefined>(undefined);
  const [requestOpen, setRequestOpen] = useState(false);
  const [notice, setNotice] = useState<string | null>(
    () => (location.state as StudioLocationState | null)?.notice ?? null,
  );
  const [duplicateAsked, setDuplicateAsked] = useState(false);
  const saveDesign = useSaveDesign();
  // Save is disabled while it saves, which takes the keyboard focus off it: once done, it goes back there
  // (if it was there and nothing else took it meanwhile), not to the start of the page.
  const saveButton = useRef<HTMLButtonElement>(null);
  const refocusSave = useRef(Boolean((location.state as StudioLocationState | null)?.focusSave));
  useEffect(() => {
    if (saveDesign.isPending || !refocusSave.current) return;
    refocusSave.current = false;
    const active = document.activeElement;
    if (!active || active === document.body) saveButton.current?.focus();
  }, [saveDesign.isPending]);
  // What the sending page said is said once: the history entry forgets it, so a reload does not repeat it.
  useEffect(() => {
    if (location.state)
      void navigate(`${location.pathname}${location.search}`, { replace: true, state: null });
    // Once, on opening.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, []);
  const dirtyNow = form.formState.isDirty || upload !== savedUpload;
  const { leaving, dialog: leaveDialog } = useUnsavedChangesGuard(dirtyNow);
  const duplicate = useDuplicateDesign();
  const requestJob = useRequestCutJob();
  // A draft whose request was refused: the next request of this design takes it up rather than making another.
  const keptDraft = useRef<JobView | null>(null);

  const values = useWatch({ control: form.control }) as DesignFormValues;
  const parsed = designFormSchema.safeParse(values);
  const spec = useMemo(
    () => (parsed.success ? toDesignSpec(parsed.data, upload) : null),
    // The parsed values are compared by content so an unchanged form does not rebuild the model.
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [JSON.stringify(parsed.success ? parsed.data : null), upload],
  );
  // While the form has errors the last spec without errors stays on screen (the model does not vanish).
  const shown = useLastValid(
    useMemo(
      () =>
        parsed.success
          ? { spec, colourCount: parsed.data.colourCount, colourRule: parsed.data.colourRule }
          : null,
      // spec changes with the parsed values, which hold the colours too.
      // eslint-disable-next-line react-hooks/exhaustive-deps
      [parsed.success, spec],
    ),
  );
  const colourCount = shown?.colourCount ?? 1;
  const colourRule: ColourRuleName = shown?.colourRule ?? 'neighbour-distinct';
  const { preview, fit, fitting, building } = useStudioPreview(shown?.spec ?? null, colourCount, colourRule);
  // The details are dimmed with the model while a build that takes a while runs (see StudioPreviewPanel).
  const slowBuild = useDelayedFlag(building && !fitting, BUILDING_NOTICE_DELAY_MS);
  // Said away from the field (preview, sheets), so it names the field.
  const firstIssue = parsed.success ? undefined : parsed.error.issues[0];
  const formError = parsed.success
    ? null
    : firstIssue
      ? describeFormIssue(firstIssue)
      : 'a field is not valid';
  const report = preview.report;
  // Stable between keystrokes, so the memoised panels skip the keystroke's render.
  const fmt = useCallback((mm: number) => formatLength(mm, unit), [unit]);
  const piece = report?.pieces.find((p) => p.id === selected) ?? report?.pieces[0];
  const suggestedSizes = useStableValue(report?.suggestedSizes ?? null);
  const applyColourCount = useCallback(
    (count: number) => {
      // Each colour is cut from its own sheets: a fit to fewer sheets than colours is raised with it, so the
      // offer made does not lead straight into another message.
      const { scaleBy, fitSheets } = form.getValues();
      if (scaleBy === 'fitSheets' && Number.isFinite(fitSheets) && fitSheets < count) {
        form.setValue('fitSheets', count, { shouldDirty: true });
      }
      form.setValue('colourCount', count, { shouldDirty: true, shouldValidate: true });
      void form.trigger(['fitSheets', 'colourCount']);
    },
    [form],
  );

  /** Saves the form's values: the saved design, or null when nothing was saved (the page says why). */
  const saveValues = async (v: DesignFormValues): Promise<DesignView | null> => {
    const body = toSavedSpec(v, upload);
    if (!body) {
      setNotice('Upload a solid file first.');
      return null;
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
      .catch((error: unknown) => {
        // A refused name or description is marked at its field too (the alert above the page says it as well).
        applyServerFieldErrors(error, form.setError, ['name', 'description']);
        return null;
      });
    if (!saved) return null;
    // What was saved is the new starting point: nothing is unsaved now (edits made while saving still are).
    form.reset(v, { keepValues: true });
    setSavedUpload(upload);
    setNotice(`Saved “${saved.name}”.`);
    if (!design) {
      leaving.current = true;
      const state: StudioLocationState = { notice: `Saved “${saved.name}”.`, focusSave: refocusSave.current };
      void navigate(`/designs/${saved.id}`, { replace: true, state });
    }
    return saved;
  };
  const save = form.handleSubmit(async (v) => {
    await saveValues(v);
  });

  // The server copies the design as last saved; the copy opens saying which version it holds.
  const copySaved = async (source: DesignView) => {
    const copy = await duplicate.mutateAsync(source.id).catch(() => null);
    if (copy) {
      const state: StudioLocationState = {
        notice: `This is a copy of “${source.name}” as saved in version ${source.version}.`,
      };
      void navigate(`/designs/${copy.id}`, { state });
    }
  };
  const onDuplicate = async () => {
    if (!design) return;
    // With unsaved changes the member chooses: save them first, or copy the saved version without them.
    if (dirtyNow) {
      duplicate.reset();
      setDuplicateAsked(true);
      return;
    }
    await copySaved(design);
  };
  const onSaveAndDuplicate = async () => {
    let saved: DesignView | null = null;
    await form.handleSubmit(async (v) => {
      saved = await saveValues(v);
    })();
    setDuplicateAsked(false);
    if (saved) await copySaved(saved);
  };
  const onDuplicateSaved = async () => {
    setDuplicateAsked(false);
    if (!design) return;
    // Chosen knowing the changes stay behind (the dialog says so): the copy opens without asking again.
    leaving.current = true;
    await copySaved(design);
    leaving.current = false;
  };

  const onRequest = async (v: RequestJobValues) => {
    if (!design) return;
    const job = await requestJob
      .mutateAsync({ designId: design.id, ...v, draft: keptDraft.current ?? undefined })
      .catch((error: unknown) => {
        if (error instanceof DraftKeptError) keptDraft.current = error.draft;
        return null;
      });
    if (job) {
      keptDraft.current = null;
      void navigate(`/jobs/${job.id}`);
    }
  };

  const dirty = dirtyNow;
  const onSave = useStableCallback(() => {
    refocusSave.current = document.activeElement === saveButton.current;
    void save();
  });
  const onDuplicateClick = useStableCallback(() => void onDuplicate());
  const onRequestClick = useStableCallback(() => {
    requestJob.reset();
    setRequestOpen(true);
  });
  const onRequestSubmit = useStableCallback((v: RequestJobValues) => void onRequest(v));
  const onRequestClose = useStableCallback(() => setRequestOpen(false));
  const canSave = design === null || user.role === 'supervisor' || user.id === design.ownerId;

  return (
    <Box data-testid="design-studio">
      <title>{`${design?.name ?? 'New design'} · Design studio · Kerfwright`}</title>
      <StudioHeader
        design={design}
        unit={unit}
        onUnit={setUnit}
        onSave={onSave}
        saving={saveDesign.isPending}
        saveRef={saveButton}
        onDuplicate={onDuplicateClick}
        duplicating={duplicate.isPending}
        onRequest={onRequestClick}
        requestBlocked={requestBlockedReason({
          dirty,
          canSave,
          formError,
          fitting,
          report,
          failure: preview.failure,
          noColourPlan: preview.colourMessage !== null,
        })}
        canSave={canSave}
      />
      {saveDesign.error ? <FormErrorAlert error={saveDesign.error} /> : null}
      {duplicate.error ? <FormErrorAlert error={duplicate.error} /> : null}

      <Box sx={{ display: 'grid', gap: 2, gridTemplateColumns: { xs: '1fr', lg: '380px 1fr' } }}>
        <Paper variant="outlined" sx={{ p: 2, alignSelf: 'start' }}>
          <SpecForm
            form={form}
            upload={upload}
            onUpload={setUpload}
            suggestedSizes={suggestedSizes}
            unit={unit}
            newDesign={design === null}
            onStockShown={setStockMaterialId}
          />
        </Paper>

        <Stack spacing={2} sx={{ minWidth: 0 }}>
          <StudioPreviewPanel
            preview={preview}
            fittingSheets={fitting && fit ? fit.sheets : null}
            unfitted={unfittedNote(fit)}
            building={building}
            showingLastValid={formError !== null}
            idleMessage={
              values.solidSource === 'upload' && !upload
                ? 'Drop an OBJ or OFF file of a convex solid to see the model.'
                : 'Correct the marked fields to see the model.'
            }
            selectedPiece={piece?.id}
            onSelectPiece={setSelected}
            formatLength={fmt}
            onUseColours={applyColourCount}
          />
          {report ? (
            <StudioDetailsPanel
              report={report}
              pieceColour={preview.pieceColour}
              tab={tab}
              onTab={setTab}
              selectedPiece={piece?.id}
              onSelectPiece={setSelected}
              formatLength={fmt}
              busy={fitting || slowBuild}
            />
          ) : null}
          <StudioSheetsPanel
            spec={shown?.spec ?? null}
            preview={preview}
            fit={fit}
            blocked={formError}
            colourCount={colourCount}
            colourRule={colourRule}
            unit={unit}
            stockMaterialId={stockMaterialId}
          />
        </Stack>
      </Box>

      <RequestJobDialogMemo
        open={requestOpen}
        busy={requestJob.isPending}
        error={requestJob.error}
        onSubmit={onRequestSubmit}
        onClose={onRequestClose}
      />
      {design ? (
        <DuplicateDialog
          open={duplicateAsked}
          savedVersion={design.version}
          canSave={canSave}
          busy={saveDesign.isPending || duplicate.isPending}
          onSaveAndDuplicate={() => void onSaveAndDuplicate()}
          onDuplicateSaved={() => void onDuplicateSaved()}
          onClose={() => setDuplicateAsked(false)}
        />
      ) : null}
      <NoticeSnackbar notice={notice} autoHideMs={4000} onClose={() => setNotice(null)} />
      {leaveDialog}
    </Box>
  );
}

/** Why a cut job cannot be requested now, in the words the button's tooltip shows; null when it can. */
function requestBlockedReason({
  dirty,
  canSave,
  formError,
  fitting,
  report,
  failure,
  noColourPlan,
}: {
  dirty: boolean;
  /** Whether this member may save the design: one who may not cannot follow "save the changes first". */
  canSave: boolean;
  formError: string | null;
  fitting: boolean;
  report: DesignReport | null;
  failure: string | null;
  /** The colour rule cannot be met with the count asked: the API counts it an error (COLOUR.NO_PLAN). */
  noColourPlan: boolean;
}): string | null {
  if (formError !== null) return 'Correct the marked fields first';
  if (dirty && !canSave)
    return 'A request takes the design as saved: undo your changes, or duplicate the design to keep them';
  if (dirty) return 'Save the changes first';
  if (fitting) return REQUEST_WAITS_FOR_FIT;
  if (!report) return failure ? 'The design does not build: see the preview' : REQUEST_WAITS_FOR_PREVIEW;
  if (report.errors.length > 0)
    return `The design has ${countOf(report.errors.length, 'error')}: see the Report tab`;
  if (noColourPlan) return 'The colour rule cannot be met with these colours: see the colour notice';
  return null;
}

/** The last value that was not null (null until there has been one). */
function useLastValid<T>(value: T | null): T | null {
  const ref = useRef<T | null>(null);
  if (value !== null) ref.current = value;
  return ref.current;
}

/** The same object while its content is equal (compared as JSON), so memoised children can skip a render. */
function useStableValue<T>(value: T): T {
  const ref = useRef<{ json: string; value: T } | null>(null);
  const json = JSON.stringify(value);
  if (!ref.current || ref.current.json !== json) ref.current = { json, value };
  return ref.current.value;
}
