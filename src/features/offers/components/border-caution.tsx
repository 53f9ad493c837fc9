import { Caution } from '#src/components/ui/caution';

/** Shown wherever seed may leave one place for another: offers, links and acceptances. */
export function BorderCaution({ className }: { className?: string }) {
  return (
    <Caution title="Seed crossing a border" className={className} foldOnPhone>
      Seed sent to another country or region may need a phytosanitary certificate, or be barred by import or
      noxious-weed rules. Check the rules where the seed goes, and follow local advice. Treated seed must stay
      labelled as treated.
    </Caution>
  );
}
