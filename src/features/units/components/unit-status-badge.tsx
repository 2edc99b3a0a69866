import { UNIT_STATUS_LABELS, type UnitStatus } from '../../../../shared/schemas/units';
import { Badge } from '../../../components/ui/page';

const TONES = { in_service: 'okay', out_of_service: 'neutral', retired: 'muted' } as const;

export function UnitStatusBadge({ status }: { status: UnitStatus }) {
  return <Badge tone={TONES[status]}>{UNIT_STATUS_LABELS[status]}</Badge>;
}
