import { zodResolver } from '@hookform/resolvers/zod';
import { type LocalRulesView } from '@kerfwright/contracts';
import Button from '@mui/material/Button';
import Stack from '@mui/material/Stack';
import { useForm } from 'react-hook-form';
import { FormErrorAlert } from '../../../components/ui/form-error-alert';
import { FormTextField } from '../../../components/ui/form-text-field';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { type LocalRulesInput, localRulesSchema, useUpdateLocalRules } from '../api/update-local-rules';

/** A supervisor rewrites the workshop's local rules; saving makes a new version that operators acknowledge. */
export function LocalRulesForm({ rules, onDone }: { rules: LocalRulesView | null; onDone: () => void }) {
  const update = useUpdateLocalRules();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
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
  return (
    <form noValidate onSubmit={(e) => void submit(e)}>
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
