import { z } from 'zod';

/** The co-op's own rules, which every applicant agrees to; edited by the admin from a known version. */
export const coopRulesUpdateSchema = z.strictObject({
  rulesText: z
    .string()
    .trim()
    .min(20, 'Write the rules out (at least 20 characters); applicants agree to them')
    .max(10_000, 'Keep the rules under 10,000 characters'),
  version: z.number({ message: 'Reload the page and try again' }).int().min(0),
});
export type CoopRulesUpdateInput = z.infer<typeof coopRulesUpdateSchema>;
