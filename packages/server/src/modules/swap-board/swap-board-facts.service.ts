import type { Transaction } from 'sequelize';
import type { SessionUser } from '../../lib/session-user';
import { rows } from './swap-board-queries';

/** Whether the Swap Board shows a photo to the viewer: one the seller picked for a listing the co-op sees (not a draft). */
export async function isPhotoListed(tx: Transaction, actor: SessionUser, photoId: string): Promise<boolean> {
  const [found] = await rows<{ yes: boolean }>(
    tx,
    `SELECT true AS yes WHERE EXISTS (SELECT 1 FROM swap_listings l WHERE l.coop_id = $1 AND l.state <> 'draft' AND $2::uuid = ANY(l.photo_ids))`,
    [actor.coopId, photoId],
  );
  return Boolean(found);
}
