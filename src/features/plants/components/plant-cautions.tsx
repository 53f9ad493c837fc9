import type { ParentPlantDto } from '#shared/schemas/lots';
import { Caution } from '#src/components/ui/caution';

/** The server's seed-saving cautions for a plant (F1 hybrid, outcrossing, poisonous). */
export function PlantCautions({ plant }: { plant: Pick<ParentPlantDto, 'cautions' | 'label'> }) {
  if (plant.cautions.length === 0) return null;
  return (
    <ul aria-label={`Cautions for ${plant.label}`} className="grid gap-1.5">
      {plant.cautions.map((text) => (
        <li key={text} className="flex gap-2 text-sm text-seedcoat-900">
          <span aria-hidden="true" className="mt-0.5 text-seedcoat-700">
            ▲
          </span>
          <span>{text}</span>
        </li>
      ))}
    </ul>
  );
}

export function HybridCaution() {
  return (
    <Caution title="F1 hybrid: seed will not come true">
      Seed saved from an F1 hybrid grows into a mix of its parents’ traits, and few plants look like the one
      you saved from. Save it as an experiment, and label the lot that way.
    </Caution>
  );
}
