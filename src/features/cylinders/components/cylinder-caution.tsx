import { Alert } from '../../../components/ui/alert';

/**
 * Shown wherever a cylinder is filled or emptied. Common practice, no published source checked: never fill a
 * recovery cylinder beyond the maximum its maker marks on it.
 */
export function CylinderCaution({ recovery }: { recovery: boolean }) {
  return (
    <Alert tone="heed" title="Cylinders are under pressure">
      {recovery
        ? "Never fill a recovery cylinder beyond the cylinder maker's marked maximum: liquid expands when it warms and an overfilled cylinder can burst. Tightloop refuses a recovery that would pass it. "
        : 'Liquid refrigerant causes frostbite; wear gloves and eye protection, and keep cylinders upright and away from heat. '}
      Never mix refrigerants in one cylinder. Local regulations and the cylinder and equipment makers&apos; instructions
      take precedence over anything shown here.
    </Alert>
  );
}
