import Button from '@mui/material/Button';
import CardActions from '@mui/material/CardActions';

/** A waiting card's two ways out: approve it, or open the send-back dialog. */
export function DecisionActions({
  approveLabel,
  approving,
  onApprove,
  onSendBack,
}: {
  approveLabel: string;
  approving: boolean;
  onApprove: () => void;
  onSendBack: () => void;
}) {
  return (
    <CardActions sx={{ px: 2, pb: 2 }}>
      <Button variant="contained" color="success" loading={approving} onClick={onApprove}>
        {approveLabel}
      </Button>
      <Button color="error" onClick={onSendBack}>
        Send back
      </Button>
    </CardActions>
  );
}
