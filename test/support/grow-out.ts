import {
  feedPurchaseCreateSchema, feedUseCreateSchema, groupWeighInCreateSchema, growOutGroupCreateSchema,
  type FeedPurchaseCreateBody, type FeedUseCreateBody, type GroupWeighInCreateBody, type GrowOutGroupCreateBody, type GrowOutGroupDto,
} from '@burrowline/shared';
import { connectDatabase } from '../../packages/server/src/composition/database';
import { recordFeedPurchase, recordFeedUse } from '../../packages/server/src/modules/feed/feed.service';
import { formGroup, recordGroupWeighIn } from '../../packages/server/src/modules/grow-out/grow-out.service';
import { daysAgo, kindlingAs, litterAs, serviceAs } from './almanac';
import { asTenant } from './db';
import type { TestPerson } from './factories';
import { actorOf, addAnimalAs } from './herd';

/** A litter of the person's farm kindled `kindledDaysAgo` days ago with `kits` kits alive (no weaning recorded). */
export async function grownLitterAs(person: TestPerson, kindledDaysAgo: number, kits: number, doe?: string) {
  return litterAs(person, { servicedDaysAgo: kindledDaysAgo + 31, kindledDaysAgo, bornAlive: kits, doe });
}

/** A litter of a sire of one breed and a dam of another (the same breed: purebred), `kits` kits alive. */
export async function breedLitterAs(person: TestPerson, opts: { kindledDaysAgo: number; kits: number; sireBreedId: string | null; damBreedId: string | null; doe?: string; buck?: string }) {
  const doe = await addAnimalAs(person, { sex: 'doe', name: opts.doe ?? 'Test doe', birthDate: '2023-01-10', breedId: opts.damBreedId });
  const buck = await addAnimalAs(person, { sex: 'buck', name: opts.buck ?? 'Test buck', birthDate: '2022-11-02', breedId: opts.sireBreedId });
  const service = await serviceAs(person, { doeId: doe.id, buckId: buck.id, servicedOn: daysAgo(opts.kindledDaysAgo + 31) });
  const litter = await kindlingAs(person, { serviceId: service.id, kindledOn: daysAgo(opts.kindledDaysAgo), bornAlive: opts.kits, bornDead: 0 });
  return { doe, buck, litter };
}

/** Forms a group through the service (arranging state without HTTP). */
export async function groupAs(person: TestPerson, body: GrowOutGroupCreateBody): Promise<GrowOutGroupDto> {
  connectDatabase(process.env.DATABASE_URL!);
  return formGroup(actorOf(person), growOutGroupCreateSchema.parse(body));
}

export async function weighGroupAs(person: TestPerson, groupId: string, body: GroupWeighInCreateBody): Promise<GrowOutGroupDto> {
  return recordGroupWeighIn(actorOf(person), groupId, groupWeighInCreateSchema.parse(body));
}

export async function purchaseAs(person: TestPerson, body: FeedPurchaseCreateBody) {
  connectDatabase(process.env.DATABASE_URL!);
  return recordFeedPurchase(actorOf(person), feedPurchaseCreateSchema.parse(body));
}

export async function feedAs(person: TestPerson, body: FeedUseCreateBody) {
  return recordFeedUse(actorOf(person), feedUseCreateSchema.parse(body));
}

/** Rows of the grow-out and feed tables of a co-op, for "nothing was written" checks. */
export async function growOutCounts(coopId: string) {
  return asTenant(coopId, async (c) => {
    const count = async (table: string, extra = '') => (await c.query(`SELECT count(*)::int AS n FROM ${table} WHERE coop_id = $1 ${extra}`, [coopId])).rows[0].n as number;
    return {
      groups: await count('grow_out_groups'),
      groupLitters: await count('grow_out_group_litters'),
      groupWeighIns: await count('weigh_ins', 'AND group_id IS NOT NULL'),
      purchases: await count('feed_purchases'),
      uses: await count('feed_uses'),
      liveFeedEntries: await count('feed_uses', 'AND deleted_at IS NULL') + await count('feed_purchases', 'AND deleted_at IS NULL'),
      shares: await count('feed_use_shares'),
      groupVersions: (await c.query(`SELECT string_agg(status || ':' || version, ',' ORDER BY id) AS s FROM grow_out_groups WHERE coop_id = $1`, [coopId])).rows[0].s as string | null,
    };
  });
}
