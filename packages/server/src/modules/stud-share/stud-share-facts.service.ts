import type { Transaction } from 'sequelize';
import type { SessionUser } from '../../lib/session-user';
import { rows } from './stud-share-queries';

/**
 * Whether Stud Share shows a photo to the viewer: one the owner picked for an offered buck card (the
 * co-op sees the card), or a hand-over or return photo of a loan the viewer's farm is party to.
 */
export async function isPhotoPublished(tx: Transaction, actor: SessionUser, photoId: string): Promise<boolean> {
  const [found] = await rows<{ yes: boolean }>(
    tx,
    `SELECT true AS yes WHERE EXISTS (SELECT 1 FROM stud_offers o WHERE o.coop_id = $1 AND o.status = 'offered' AND $2::uuid = ANY(o.photo_ids))
       OR EXISTS (SELECT 1 FROM stud_loans l WHERE l.coop_id = $1 AND $3::uuid IN (l.owner_farm_id, l.borrower_farm_id)
                  AND $2::text IN (l.hand_over->>'photoId', l.return_step->>'photoId'))`,
    [actor.coopId, photoId, actor.farmId],
  );
  return Boolean(found);
}
