import { type KerfRecordView, type MachineProfileDetailView } from '@kerfwright/contracts';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableContainer from '@mui/material/TableContainer';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import { useState } from 'react';
import { errorMessage } from '../../../lib/api-client';
import { useAdoptKerfRecord } from '../api/adopt-kerf-record';
import { useCreateKerfRecord } from '../api/create-kerf-record';
import { useKerfRecords } from '../api/get-kerf-records';
import { KerfHistoryChart, type KerfReference } from './kerf-history-chart';
import { KerfRecordDialog } from './kerf-record-dialog';
import { NATIVE_SELECT } from '../../../components/ui/native-select-field';
import { formatDateTime } from '../../../lib/dates';
import { formatKerf, type LengthUnit } from '../../../lib/units';
import { useScrollFocus } from '../../../lib/use-scroll-focus';

/**
 * The kerf history of one material on this machine: measurements over time against the approved and the
 * newest version's value, with "adopt" to put a measured value into a draft version.
 */
export function KerfHistoryPanel({
  profile,
  unit,
  onAdopted,
}: {
  profile: MachineProfileDetailView;
  /** The unit kerfs are shown and typed in (they are kept in millimetres). */
  unit: LengthUnit;
  onAdopted: (message: string) => void;
}) {
  const kerf = (mm: number) => formatKerf(mm, unit);
  const records = useKerfRecords(profile.id);
  const adopt = useAdoptKerfRecord(profile.id);
  const record = useCreateKerfRecord(profile.id);
  const [recording, setRecording] = useState(false);
  const [justAdopted, setJustAdopted] = useState<string | null>(null);
  const router = profile.kind === 'cnc-router';
  const quantity = router ? 'cut width' : 'kerf';
  const scrollFocus = useScrollFocus(`Measured ${quantity}s`);

  // Materials this machine has settings or measurements for, newest version first.
  const materials = new Map<string, string>();
  for (const v of profile.versions) for (const s of v.settings) materials.set(s.materialId, s.materialName);
  for (const r of records.data?.items ?? [])
    if (!materials.has(r.materialId)) materials.set(r.materialId, r.materialName);
  const choices = [...materials].map(([id, name]) => ({ id, name }));
  const [chosen, setChosen] = useState('');
  const materialId = chosen || choices[0]?.id || '';

  const mine: KerfRecordView[] = (records.data?.items ?? []).filter((r) => r.materialId === materialId);
  const valueIn = (v: MachineProfileDetailView['latest'] | null) => {
    const s = v?.settings.find((x) => x.materialId === materialId);
    return router ? s?.toolDiameterMm : s?.kerfMm;
  };
  const references: KerfReference[] = [];
  const approved = valueIn(profile.currentApproved);
  if (profile.currentApproved && approved !== undefined) {
    references.push({
      label: `Approved v${profile.currentApproved.number}`,
      valueMm: approved,
      colour: '#2e7d32',
    });
  }
  const latest = valueIn(profile.latest);
  if (profile.latest.id !== profile.currentApproved?.id && latest !== undefined) {
    references.push({
      label: `${profile.latest.state === 'draft' ? 'Draft' : 'Newest'} v${profile.latest.number}`,
      valueMm: latest,
      colour: '#ed6c02',
      dashed: true,
    });
  }
  const versionNumber = (id: string | null) => profile.versions.find((v) => v.id === id)?.number;
  const pending = profile.latest.state === 'submitted';

  return (
    <Box data-testid="kerf-history">
      <Box sx={{ display: 'flex', gap: 2, alignItems: 'center', flexWrap: 'wrap', mb: 2 }}>
        <TextField
          id="kerf-material"
          select
          size="small"
          label="Material"
          value={materialId}
          onChange={(e) => setChosen(e.target.value)}
          slotProps={NATIVE_SELECT}
          sx={{ minWidth: 260 }}
        >
          {choices.map((m) => (
            <option key={m.id} value={m.id}>
              {m.name}
            </option>
          ))}
        </TextField>
        <Button
          variant="outlined"
          onClick={() => {
            record.reset();
            setRecording(true);
          }}
        >
          Record a measured {quantity}
        </Button>
      </Box>
      {records.isError ? <Alert severity="error">{errorMessage(records.error)}</Alert> : null}
      {adopt.error ? (
        <Alert severity="error" sx={{ mb: 2 }} role="alert">
          {errorMessage(adopt.error)}
        </Alert>
      ) : null}
      <KerfHistoryChart records={mine} references={references} quantity={quantity} unit={unit} />
      {mine.length > 0 ? (
        <TableContainer {...scrollFocus} sx={{ mt: 2, overflowX: 'auto' }}>
          <Table
            size="small"
            aria-label={`Measured ${quantity}s`}
            // Narrower cell padding on a phone, so the four columns fit its width.
            sx={{ '& .MuiTableCell-root': { px: { xs: 1, sm: 2 } } }}
          >
            <TableHead>
              <TableRow>
                <TableCell>Measured</TableCell>
                <TableCell>Value</TableCell>
                <TableCell>Notes</TableCell>
                <TableCell align="right">Into a version</TableCell>
              </TableRow>
            </TableHead>
            <TableBody>
              {[...mine].reverse().map((r) => (
                <TableRow key={r.id} data-testid="kerf-record">
                  {/* On a phone the date wraps: on one line it pushed "Adopt" out of sight, sideways. */}
                  <TableCell sx={{ whiteSpace: { xs: 'normal', sm: 'nowrap' } }}>
                    {formatDateTime(r.createdAt)}
                  </TableCell>
                  <TableCell>{kerf(r.kerfMm)}</TableCell>
                  <TableCell>{r.notes || '—'}</TableCell>
                  <TableCell align="right">
                    {r.adoptedVersionId ? (
                      <Box
                        component="span"
                        tabIndex={-1}
                        sx={{ '&:focus': { outline: 'none' } }}
                        ref={(el: HTMLElement | null) => {
                          // The button just used is gone: the keyboard stays on its row, with what it did.
                          if (el && r.id === justAdopted) {
                            el.focus();
                            setJustAdopted(null);
                          }
                        }}
                      >
                        {`Adopted into version ${versionNumber(r.adoptedVersionId) ?? '?'}`}
                      </Box>
                    ) : (
                      <Button
                        size="small"
                        disabled={pending || adopt.isPending}
                        title={pending ? 'Wait for the decision on the submitted version' : undefined}
                        onClick={() =>
                          adopt.mutate(r.id, {
                            onSuccess: (v) => {
                              setJustAdopted(r.id);
                              onAdopted(`${kerf(r.kerfMm)} is in draft version ${v.number}.`);
                            },
                          })
                        }
                      >
                        Adopt {kerf(r.kerfMm)}
                      </Button>
                    )}
                  </TableCell>
                </TableRow>
              ))}
            </TableBody>
          </Table>
        </TableContainer>
      ) : null}
      <Typography variant="body2" color="text.secondary" sx={{ mt: 1 }}>
        Adopting puts the value into the open draft (or a new draft from the newest version); a supervisor
        approves it before jobs use it.
      </Typography>
      <KerfRecordDialog
        open={recording}
        kind={profile.kind}
        unit={unit}
        materials={choices}
        defaultMaterialId={materialId}
        busy={record.isPending}
        error={record.error}
        onSubmit={(v) =>
          record.mutate(
            { materialId: v.materialId, kerfMm: v.kerfMm, notes: v.notes || undefined },
            {
              onSuccess: () => {
                setChosen(v.materialId);
                setRecording(false);
              },
            },
          )
        }
        onClose={() => setRecording(false)}
      />
    </Box>
  );
}
