import { zodResolver } from '@hookform/resolvers/zod';
import { type LocalRulesView } from '@kerfwright/contracts';
import Button from '@mui/material/Button';
import Stack from '@mui/material/Stack';
import { useEffect, useRef } from 'react';
import { useForm } from 'react-hook-form';
import { focusFirstField } from '../../../components/ui/focus-first-field';
import { FormErrorAlert } from '../../../components/ui/form-error-alert';
import { FormTextField } from '../../../components/ui/form-text-field';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { type LocalRulesInput, localRulesSchema, useUpdateLocalRules } from '../api/update-local-rules';

/**
 * A supervisor rewrites the workshop's local rules; saving makes a new version that operators acknowledge.
 * It opens with the keyboard at the end of the rules; Escape leaves it while nothing has been changed.
 */
export function LocalRulesForm({ rules, onDone }: { rules: LocalRulesView | null; onDone: () => void }) {
  const update = useUpdateLocalRules();
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
      await update.mutateAsync({ body: v.body.trim() });
      onDone();
    } catch (error) {
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
        {update.error && errors.body?.type !== 'server' ? <FormErrorAlert error={update.error} /> : null}
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
