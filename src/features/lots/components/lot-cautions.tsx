import type { LotDto } from '#shared/schemas/lots';
import { SwapCaution, TreatedCaution } from './lot-form-parts';

/** The cautions a lot itself calls for (treated seed, a swap), for the top of its page. */
export function LotCautions({ lot }: { lot: Pick<LotDto, 'treated' | 'origin'> }) {
  const notes = [
    lot.treated ? <TreatedCaution key="treated" /> : null,
    lot.origin === 'swapped' ? <SwapCaution key="swap" /> : null,
  ].filter(Boolean);
  return notes.length ? <>{notes}</> : null;
}
