import type { MyRoundDetail } from '@ringlet/shared/contracts/bench';
import { mentionsSharps } from '@ringlet/shared/contracts/safety';
import type { SubmissionData } from '@ringlet/shared/contracts/submission';

/**
 * The sharps cautions join the list when the instructions or an item's notes mention syringes,
 * needles or filters, or when the lab states a filter pore size (filtering means a syringe filter).
 */
export function usesSharps(
  round: Pick<MyRoundDetail, 'instructions' | 'items'>,
  data: Pick<SubmissionData, 'items'> | null,
): boolean {
  const filtered = (data?.items ?? []).some(
    (i) => i.conditions.filterPoreUm !== null && i.conditions.filterPoreUm !== undefined,
  );
  return (
    filtered ||
    mentionsSharps(
      [
        round.instructions,
        ...round.items.map((i) => `${i.handlingNotes ?? ''} ${i.storageNotes ?? ''}`),
      ].join(' '),
    )
  );
}
