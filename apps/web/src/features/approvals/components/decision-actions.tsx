import Button from '@mui/material/Button';
import CardActions from '@mui/material/CardActions';
import Typography from '@mui/material/Typography';

/** A waiting card's two ways out: approve it, or open the send-back dialog. */
export function DecisionActions({
  approveLabel,
  approving,
  onApprove,
  onSendBack,
  approveBlocked,
  sendBackLabel = 'Send back',
  subject,
}: {
  approveLabel: string;
  approving: boolean;
  onApprove: () => void;
  onSendBack: () => void;
  /** Why the caller cannot approve this (the server would refuse): said instead of offering the button. */
  approveBlocked?: string | null;
  /** What the way back is called: "Send back" for a version, the job action's own label for a job. */
  sendBackLabel?: string;
  /**
   * What is decided on (a job's design name), added to the buttons' accessible names after their visible
   * text: a list of cards with the same "Approve the job" buttons cannot be told apart by ear (WCAG 2.4.6,
   * 2.5.3 label in name).
   */
  subject?: string;
}) {
  const named = (label: string) => (subject ? `${label}: ${subject}` : undefined);
  return (
    <CardActions sx={{ px: 2, pb: 2 }}>
      {approveBlocked ? (
        <Typography variant="body2" color="text.secondary" sx={{ flex: 1 }} data-testid="approve-blocked">
          {approveBlocked}
        </Typography>
      ) : (
        <Button
          variant="contained"
          color="success"
          loading={approving}
          onClick={onApprove}
          aria-label={named(approveLabel)}
        >
          {approveLabel}
        </Button>
      )}
      <Button color="error" onClick={onSendBack} aria-label={named(sendBackLabel)}>
        {sendBackLabel}
      </Button>
    </CardActions>
  );
}
