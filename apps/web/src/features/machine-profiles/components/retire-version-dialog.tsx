import { type FormDialogBaseProps } from '../../../components/ui/form-dialog';
import { ReasonDialog, type ReasonValues } from '../../../components/ui/reason-dialog';

/**
 * Takes a machine's approved version out of use (a cracked tube, a bed out of square, a failed inspection). No
 * job can then be prepared, approved or released on the machine until a newer version is approved; jobs already
 * released stay on the release desk, marked, for a fabricator or supervisor to return.
 */
export function RetireVersionDialog(
  props: FormDialogBaseProps<ReasonValues> & { profileName: string; versionNumber: number },
) {
  const { profileName, versionNumber, ...dialog } = props;
  return (
    <ReasonDialog
      {...dialog}
      titleId="retire-version-title"
      title={`Take ${profileName} out of use?`}
      intro={
        `Version ${versionNumber} stops being the machine’s approved settings. Until a newer version is ` +
        'approved, no job can be prepared, approved or released on this machine, and jobs prepared or approved on ' +
        'it must be prepared again. Jobs already released stay on the release desk, marked: return any that must ' +
        'not be cut. Fabricators, operators and supervisors are mailed your reason.'
      }
      submitLabel="Take out of use"
      tooShort="Say why, for those who prepare and cut jobs (at least 3 characters)"
    />
  );
}
