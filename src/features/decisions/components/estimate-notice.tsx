import { Alert } from '../../../components/ui/alert';

/** Shown wherever repair-or-retire figures are: they are estimates, and rules and makers' instructions come first. */
export function EstimateNotice() {
  return (
    <Alert tone="heed" title="Estimates, not instructions">
      These figures are estimates built on the assumptions listed here and the unit's recorded history. Local
      regulations and the equipment maker's service instructions take precedence over anything Tightloop computes.
    </Alert>
  );
}
