import { NOTICE_SEVERITIES } from '@kerfwright/contracts';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import CircularProgress from '@mui/material/CircularProgress';
import Paper from '@mui/material/Paper';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import { useEffect, useRef, useState } from 'react';
import { ErrorPanel } from '../../../components/errors/error-panel';
import { MarkdownText } from '../../../components/ui/markdown-text';
import { useUser } from '../../../lib/auth';
import { useHazards } from '../api/get-hazards';
import { useLocalRules } from '../api/get-local-rules';
import { useNotices } from '../api/get-notices';
import { HazardTable } from '../components/hazard-table';
import { LocalRulesForm } from '../components/local-rules-form';
import { familyLabel, kindLabel } from '../../../config/trade-labels';
import { formatDateTime } from '../../../lib/dates';

const SEVERITY = { danger: 'error', warning: 'warning', caution: 'info' } as const;

/** Everyone: the safety notices, the material hazard table and the workshop's local rules. */
export function SafetyRoute() {
  const user = useUser();
  const notices = useNotices();
  const hazards = useHazards();
  const rules = useLocalRules();
  const [editing, setEditing] = useState(false);
  // Leaving the editor (saved or not) puts the keyboard back on the button that opened it.
  const editButton = useRef<HTMLButtonElement>(null);
  const wasEditing = useRef(false);
  useEffect(() => {
    if (wasEditing.current && !editing) editButton.current?.focus();
    wasEditing.current = editing;
  }, [editing]);
  const sorted = [...(notices.data ?? [])].sort(
    (a, b) =>
      NOTICE_SEVERITIES.indexOf(a.severity) - NOTICE_SEVERITIES.indexOf(b.severity) ||
      a.title.localeCompare(b.title),
  );

  return (
    <Box sx={{ maxWidth: 1200 }} data-testid="safety-page">
      <title>Safety · Kerfwright</title>
      <Typography variant="h1" sx={{ mb: 1 }}>
        Safety
      </Typography>
      {/* The page's notices are its content, not news: notes, not alerts (WAI-ARIA 1.2: alert is for important,
          time-sensitive messages, and screen readers announce every one at once). */}
      <Alert severity="info" role="note" sx={{ mb: 3 }}>
        These notices and tables are a starting point. Local codes, the machine maker&apos;s manual and the
        workshop&apos;s own rules come first wherever they say more or differ.
      </Alert>

      <Paper variant="outlined" sx={{ p: 2, mb: 3 }}>
        <Stack direction="row" sx={{ alignItems: 'center', mb: 1 }}>
          <Typography variant="h2" sx={{ flex: 1 }}>
            Local rules
          </Typography>
          {user.role === 'supervisor' && !editing && rules.isSuccess ? (
            <Button variant="outlined" ref={editButton} onClick={() => setEditing(true)}>
              Edit the local rules
            </Button>
          ) : null}
        </Stack>
        {rules.isPending ? <CircularProgress aria-label="Loading the local rules" /> : null}
        {rules.isError ? (
          <ErrorPanel
            title="The local rules could not be loaded"
            error={rules.error}
            onRetry={() => void rules.refetch()}
          />
        ) : null}
        {rules.isSuccess && editing ? (
          <LocalRulesForm rules={rules.data} onDone={() => setEditing(false)} />
        ) : null}
        {rules.isSuccess && !editing ? (
          <>
            <Box data-testid="local-rules" sx={{ mb: 1 }}>
              {rules.data?.body ? (
                <MarkdownText title="Local rules">{rules.data.body}</MarkdownText>
              ) : (
                <Typography>The workshop has not written local rules yet.</Typography>
              )}
            </Box>
            {rules.data ? (
              <Typography variant="caption" color="text.secondary">
                {`Version ${rules.data.version}${rules.data.authorName ? ` by ${rules.data.authorName}` : ''}, ${formatDateTime(rules.data.updatedAt)}`}
              </Typography>
            ) : null}
          </>
        ) : null}
      </Paper>

      <Typography variant="h2" sx={{ mb: 1 }}>
        Notices
      </Typography>
      {notices.isError ? (
        <ErrorPanel
          title="The notices could not be loaded"
          error={notices.error}
          onRetry={() => void notices.refetch()}
        />
      ) : null}
      <Stack spacing={1.5} sx={{ mb: 3 }} data-testid="notices">
        {sorted.map((n) => (
          <Alert key={n.id} severity={SEVERITY[n.severity]} variant="outlined" role="note">
            <Typography component="h3" sx={{ fontWeight: 500 }}>
              {n.title}
            </Typography>
            <Typography variant="caption" color="text.secondary" component="div" sx={{ mb: 1 }}>
              {`Applies to ${n.appliesTo.machineKinds.map(kindLabel).join(', ')} · ${n.appliesTo.materialFamilies.map(familyLabel).join(', ')} · version ${n.version}`}
            </Typography>
            <MarkdownText title={n.title} topLevel={4}>
              {n.body}
            </MarkdownText>
            {n.sources.length ? (
              <Typography variant="caption" component="div" sx={{ mt: 1 }}>
                {`Sources: ${n.sources.join('; ')}`}
              </Typography>
            ) : null}
          </Alert>
        ))}
      </Stack>

      <Typography variant="h2" sx={{ mb: 1 }}>
        Material hazards
      </Typography>
      <Paper variant="outlined" sx={{ p: 2 }}>
        {hazards.isError ? (
          <ErrorPanel
            title="The hazard table could not be loaded"
            error={hazards.error}
            onRetry={() => void hazards.refetch()}
          />
        ) : null}
        {hazards.data ? <HazardTable rows={hazards.data} /> : null}
      </Paper>
    </Box>
  );
}
