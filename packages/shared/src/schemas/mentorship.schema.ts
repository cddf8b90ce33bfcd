import { z } from 'zod';
import { calendarDateSchema } from './animal.schema';
import { multiLine, recordId, singleLine } from './text';

const key = z.string().trim().regex(/^[a-z0-9-]{1,60}$/, 'Use lower-case letters, digits and hyphens');

/** A chore the apprentice did on the mentor's farm; a weight or a litter count goes to its own record. */
const choreEntryFields = z.strictObject({
    id: z.uuid({ message: 'Not a valid id' }).optional(),
    kind: key,
    /** Left out: the farm's today. */
    doneOn: calendarDateSchema.optional(),
    minutes: z.number({ message: 'Enter the minutes spent' }).int('Whole minutes').min(1, 'At least a minute').max(960, 'At most 16 hours in one entry'),
    animalId: recordId('The animal').optional(),
    litterId: recordId('The litter').optional(),
    groupId: recordId('The group').optional(),
    notes: multiLine(2000).default(''),
    /** A weighing of the animal or the group: the figures take it once the mentor accepts it. */
    weighing: z
      .strictObject({
        totalGrams: z.number({ message: 'Enter the weight' }).int('Weights are whole grams').min(1, 'Enter a weight above zero').max(1_000_000, 'That is more than a tonne; check the weight'),
        headCount: z.number({ message: 'Enter the head count' }).int('Whole heads').min(1, 'At least one head').max(500).default(1),
      })
      .optional(),
    /** Kits lost, culled or weaned from the litter (its count changes once accepted). */
    litterCount: z
      .strictObject({
        kind: z.enum(['lost', 'culled', 'weaned'], { message: 'Choose lost, culled or weaned' }),
        count: z.number({ message: 'Enter the kits' }).int('Whole kits').min(1, 'At least one kit').max(30),
        cause: multiLine(200).optional(),
      })
      .optional(),
    /** A palpation of the animal (a doe of the mentor's with an open service): it counts once accepted. */
    palpation: z
      .strictObject({
        result: z.enum(['positive', 'negative', 'unsure'], { message: 'Did you feel kits? Choose positive, negative or not sure' }),
      })
      .optional(),
});

export const choreEntrySchema = choreEntryFields.superRefine((v, ctx) => {
    const targets = [v.animalId, v.litterId, v.groupId].filter(Boolean).length;
    if (targets > 1) ctx.addIssue({ code: 'custom', path: ['animalId'], message: 'One animal, litter or group per entry' });
    if (v.weighing && !v.animalId && !v.groupId) ctx.addIssue({ code: 'custom', path: ['weighing'], message: 'Weigh an animal or a group' });
    if (v.weighing && v.animalId && v.weighing.headCount !== 1) ctx.addIssue({ code: 'custom', path: ['weighing', 'headCount'], message: 'One animal is one head' });
    if (v.litterCount && !v.litterId) ctx.addIssue({ code: 'custom', path: ['litterCount'], message: 'Choose the litter' });
    if (v.weighing && v.litterCount) ctx.addIssue({ code: 'custom', path: ['litterCount'], message: 'A weighing or a litter count, not both' });
    if (v.palpation && !v.animalId) ctx.addIssue({ code: 'custom', path: ['palpation'], message: 'Choose the doe you palpated' });
    if (v.palpation && (v.weighing || v.litterCount)) ctx.addIssue({ code: 'custom', path: ['palpation'], message: 'A palpation is an entry of its own' });
  });
export type ChoreEntryInput = z.infer<typeof choreEntrySchema>;
export type ChoreEntryBody = z.input<typeof choreEntrySchema>;

/** A returned entry, corrected and sent again (the version guards a second tab). */
export const choreResubmitSchema = z.strictObject({
  minutes: choreEntryFields.shape.minutes,
  doneOn: calendarDateSchema,
  notes: multiLine(2000).default(''),
  weighing: choreEntryFields.shape.weighing,
  litterCount: choreEntryFields.shape.litterCount,
  palpation: choreEntryFields.shape.palpation,
  version: z.number().int().min(0),
});
export type ChoreResubmitInput = z.infer<typeof choreResubmitSchema>;
export type ChoreResubmitBody = z.input<typeof choreResubmitSchema>;

export const reviewItemKinds = ['chore', 'palpation', 'weigh-in', 'note', 'litter-event', 'task'] as const;
export type ReviewItemKind = (typeof reviewItemKinds)[number];

export const reviewItemRefSchema = z.strictObject({ kind: z.enum(reviewItemKinds), id: z.uuid({ message: 'Not a valid id' }) });
export type ReviewItemRef = z.infer<typeof reviewItemRefSchema>;

/** Accept, or return with a comment the apprentice reads. */
export const reviewDecisionSchema = z
  .strictObject({
    decision: z.enum(['accepted', 'returned'], { message: 'Accept or return it' }),
    comment: multiLine(500).default(''),
  })
  .superRefine((v, ctx) => {
    if (v.decision === 'returned' && v.comment.length === 0) ctx.addIssue({ code: 'custom', path: ['comment'], message: 'Say what to correct' });
  });
export type ReviewDecisionInput = z.infer<typeof reviewDecisionSchema>;
export type ReviewDecisionBody = z.input<typeof reviewDecisionSchema>;

export const acceptManySchema = z.strictObject({
  items: z.array(reviewItemRefSchema).min(1, 'Choose at least one entry').max(100, 'At most 100 at once'),
});
export type AcceptManyInput = z.infer<typeof acceptManySchema>;

export const reviewQueueQuerySchema = z.strictObject({
  apprenticeId: z.uuid({ message: 'Not a valid id' }).optional(),
  kind: z.enum(reviewItemKinds).optional(),
});
export type ReviewQueueQuery = z.infer<typeof reviewQueueQuerySchema>;

export const choreLogQuerySchema = z.strictObject({
  state: z.enum(['pending', 'accepted', 'returned', 'all']).default('all'),
});
export type ChoreLogQuery = z.infer<typeof choreLogQuerySchema>;

export const skillStates = ['practising', 'signed-off', 'withdrawn'] as const;
export type SkillState = (typeof skillStates)[number];

/** The mentor marks a skill practising, signs it off, or withdraws a sign-off with a reason. */
export const skillMarkSchema = z
  .strictObject({
    state: z.enum(skillStates, { message: 'Choose practising, signed off or withdrawn' }),
    /** Left out: the farm's today. */
    on: calendarDateSchema.optional(),
    comment: multiLine(1000).default(''),
    entryIds: z.array(z.uuid({ message: 'Not a valid id' })).max(20, 'At most 20 entries').default([]),
  })
  .superRefine((v, ctx) => {
    if (v.state === 'withdrawn' && v.comment.length === 0) ctx.addIssue({ code: 'custom', path: ['comment'], message: 'Give the reason for withdrawing it' });
  });
export type SkillMarkInput = z.infer<typeof skillMarkSchema>;
export type SkillMarkBody = z.input<typeof skillMarkSchema>;

export const skillDefinitionSchema = z.strictObject({
  key,
  name: singleLine('The skill', 1, 120),
  area: singleLine('The area', 1, 60),
  signedOffMeans: multiLine(1000).refine((v) => v.length > 0, 'Say what signed off means'),
  dangerous: z.boolean().default(false),
});
export type SkillDefinition = z.infer<typeof skillDefinitionSchema>;

export const choreKindSchema = z.strictObject({ key, label: singleLine('The chore', 1, 60) });
export type ChoreKind = z.infer<typeof choreKindSchema>;

/** The admin's co-op settings: chore kinds, the checklist, and the roster rule for dangerous stations. */
export const mentorshipSettingsSchema = z
  .strictObject({
    choreKinds: z.array(choreKindSchema).min(1, 'Keep at least one chore').max(60),
    skills: z.array(skillDefinitionSchema).min(1, 'Keep at least one skill').max(80),
    requireDangerousSignOff: z.boolean(),
    version: z.number().int().min(0),
  })
  .superRefine((v, ctx) => {
    const dupe = (keys: string[]) => keys.find((k, i) => keys.indexOf(k) !== i);
    const kind = dupe(v.choreKinds.map((k) => k.key));
    if (kind) ctx.addIssue({ code: 'custom', path: ['choreKinds'], message: `${kind} is listed twice` });
    const skill = dupe(v.skills.map((s) => s.key));
    if (skill) ctx.addIssue({ code: 'custom', path: ['skills'], message: `${skill} is listed twice` });
  });
export type MentorshipSettingsInput = z.infer<typeof mentorshipSettingsSchema>;
