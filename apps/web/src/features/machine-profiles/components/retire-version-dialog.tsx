import { zodResolver } from '@hookform/resolvers/zod';
import { MACHINE_PROFILE_LIMITS } from '@kerfwright/contracts';
import { useEffect } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { FormDialog, type FormDialogBaseProps } from '../../../components/ui/form-dialog';
import { FormTextField } from '../../../components/ui/form-text-field';
import { resetUnlessSame } from '../../../lib/reset-unless-same';

/** Why a machine is taken out of use: told to everyone who prepares or cuts jobs (the API keeps 3–2000 characters). */
export const retireSchema = z.object({
  reason: z
    .string()
    .trim()
    .min(3, 'Say why, for those who prepare and cut jobs (at least 3 characters)')
    .max(MACHINE_PROFILE_LIMITS.reasonLength, `At most ${MACHINE_PROFILE_LIMITS.reasonLength} characters`),
});
export type RetireValues = z.infer<typeof retireSchema>;

/**
 * Takes a machine's approved version out of use (a cracked tube, a bed out of square, a failed inspection). No
 * job can then be prepared, approved or released on the machine until a newer version is approved; jobs already
 * released stay on the release desk, marked, for a fabricator or supervisor to return.
 */
export function RetireVersionDialog(
  props: FormDialogBaseProps<RetireValues> & { profileName: string; versionNumber: number },
) {
  const {
    register,
    handleSubmit,
    reset,
    getValues,
    formState: { errors },
  } = useForm<RetireValues>({ resolver: zodResolver(retireSchema), defaultValues: { reason: '' } });
  useEffect(() => {
    if (props.open) resetUnlessSame({ getValues, reset }, { reason: '' });
  }, [props.open, reset, getValues]);
  return (
    <FormDialog
      open={props.open}
      titleId="retire-version-title"
      title={`Take ${props.profileName} out of use?`}
      intro={
        `Version ${props.versionNumber} stops being the machine’s approved settings. Until a newer version is ` +
        'approved, no job can be prepared, approved or released on this machine, and jobs prepared or approved on ' +
        'it must be prepared again. Jobs already released stay on the release desk, marked: return any that must ' +
        'not be cut. Fabricators, operators and supervisors are mailed your reason.'
      }
      error={props.error}
      busy={props.busy}
      submitLabel="Take out of use"
      submitColor="error"
      onSubmit={handleSubmit((v) => props.onSubmit(v))}
      onClose={props.onClose}
    >
      <FormTextField
        label="Reason"
        registration={register('reason')}
        error={errors.reason}
        multiline
        minRows={3}
      />
    </FormDialog>
  );
}
