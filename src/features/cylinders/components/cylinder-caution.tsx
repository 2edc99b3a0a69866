import { Caution } from '../../../components/ui/caution';

/**
 * Shown wherever a cylinder is filled or emptied. Common practice, no published source checked: never fill a
 * recovery cylinder beyond the maximum its maker marks on it.
 */
export function CylinderCaution({ recovery }: { recovery: boolean }) {
  return (
    <Caution title="Cylinders are under pressure">
      {recovery
        ? "Never fill a recovery cylinder beyond the cylinder maker's marked maximum: liquid expands when it warms and an overfilled cylinder can burst. Tightloop refuses a recovery that would pass it. "
        : 'Liquid refrigerant causes frostbite; wear gloves and eye protection, and keep cylinders upright and away from heat. '}
      Never mix refrigerants in one cylinder, and follow the cylinder maker&apos;s instructions as well as the equipment
      maker&apos;s.
    </Caution>
  );
}
