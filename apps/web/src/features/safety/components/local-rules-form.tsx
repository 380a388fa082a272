import { zodResolver } from '@hookform/resolvers/zod';
import { type LocalRulesView } from '@kerfwright/contracts';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useRef, useState } from 'react';
import { useForm } from 'react-hook-form';
import { focusFirstField } from '../../../components/ui/focus-first-field';
import { FormErrorAlert } from '../../../components/ui/form-error-alert';
import { FormTextField } from '../../../components/ui/form-text-field';
import { isApiError } from '../../../lib/api-client';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { localRulesQueryOptions } from '../api/get-local-rules';
import { type LocalRulesInput, localRulesSchema, useUpdateLocalRules } from '../api/update-local-rules';

/**
 * A supervisor rewrites the workshop's local rules; saving makes a new version that operators acknowledge.
 * It opens with the keyboard at the end of the rules; Escape leaves it while nothing has been changed.
 */
export function LocalRulesForm({ rules, onDone }: { rules: LocalRulesView | null; onDone: () => void }) {
  const update = useUpdateLocalRules();
  const queryClient = useQueryClient();
  // The version the text is written over: another supervisor's save since is not replaced unseen (409).
  const [base, setBase] = useState(rules?.version ?? 0);
  /** The rules another supervisor saved while this form was open, shown once the save was refused. */
  const [theirs, setTheirs] = useState<LocalRulesView | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isDirty },
  } = useForm<LocalRulesInput>({
    resolver: zodResolver(localRulesSchema),
    defaultValues: { body: rules?.body ?? '' },
  });
  const submit = handleSubmit(async (v) => {
    try {
      await update.mutateAsync({ body: v.body.trim(), version: base });
      onDone();
    } catch (error) {
      if (isApiError(error) && error.code === 'SAFETY.STALE_RULES') {
        // Their rules are shown beside this text; saving again replaces them, knowingly.
        const now = await queryClient.fetchQuery({ ...localRulesQueryOptions(), staleTime: 0 });
        setTheirs(now);
        setBase(now?.version ?? 0);
        return;
      }
      applyServerFieldErrors(error, setError, ['body']);
    }
  });
  const form = useRef<HTMLFormElement>(null);
  useEffect(() => {
    if (form.current) focusFirstField(form.current);
  }, []);
  return (
    <form
      ref={form}
      noValidate
      onSubmit={(e) => void submit(e)}
      onKeyDown={(e) => {
        if (e.key === 'Escape' && !isDirty && !update.isPending) onDone();
      }}
    >
      <Stack spacing={2}>
        {theirs ? (
          <Alert severity="warning" data-testid="local-rules-theirs">
            <Typography variant="body2" sx={{ mb: 1 }}>
              {`${theirs.authorName ?? 'Another supervisor'} saved version ${theirs.version} while you were writing: ` +
                'their text is below. Saving now replaces it with yours; copy what you want to keep first.'}
            </Typography>
            <Box component="pre" sx={{ whiteSpace: 'pre-wrap', m: 0, fontFamily: 'inherit' }}>
              {theirs.body}
            </Box>
          </Alert>
        ) : update.error && errors.body?.type !== 'server' ? (
          <FormErrorAlert error={update.error} />
        ) : null}
        <FormTextField
          label="Local rules"
          registration={register('body')}
          error={errors.body}
          helperText="Markdown: start each rule with “- ” or “1. ” on its own line; a blank line starts a new paragraph"
          multiline
          minRows={8}
        />
        <Stack direction="row" spacing={1}>
          <Button type="submit" variant="contained" disabled={update.isPending}>
            Save as a new version
          </Button>
          <Button onClick={onDone}>Cancel</Button>
        </Stack>
      </Stack>
    </form>
  );
}
