import { describe, expect, it } from 'vitest';
import { applicationListQuerySchema, applicationSchema, invitationSchema, memberDisableSchema } from '../index';

const valid = {
  idempotencyKey: '6f1c1f0e-6f0a-4f57-9d1e-2f7a8f3c9b10',
  applicantName: 'Wren Applicant',
  email: ' Wren@Example.TEST ',
  phone: '',
  farmName: 'Bramblegate',
  location: 'Tamsin County',
  timeZone: 'America/Chicago',
  breedsKept: ['New Zealand'],
  does: 4,
  bucks: 1,
  quarantinePractice: 'A separate shed for 30 days before anything meets the herd.',
  diseaseLastYear: 'no',
  diseaseDetails: '',
  sharing: ['trades'],
  sharingNotes: '',
  agreeToRules: true,
};

const issuesOf = (input: unknown) => {
  const result = applicationSchema.safeParse(input);
  return result.success ? {} : Object.fromEntries(result.error.issues.map((i) => [i.path.join('.'), i.message]));
};

describe('membership schemas', () => {
  it('when an application is complete, then it parses with the e-mail normalised', () => {
    expect(applicationSchema.parse(valid).email).toBe('wren@example.test');
  });

  it('when the applicant does not agree to the rules, then the form says so under the box', () => {
    expect(issuesOf({ ...valid, agreeToRules: false }).agreeToRules).toMatch(/Agree to the co-op's rules/);
  });

  it('when disease is reported without details, then the details field asks what it was', () => {
    expect(issuesOf({ ...valid, diseaseLastYear: 'yes' }).diseaseDetails).toMatch(/Say what it was/);
    expect(issuesOf({ ...valid, diseaseLastYear: 'yes', diseaseDetails: 'Snuffles in one doe, culled.' })).toEqual({});
  });

  it('when a name carries a line break, then it is refused (nothing of it reaches an e-mail header)', () => {
    expect(issuesOf({ ...valid, applicantName: 'Wren\nBcc: all@example.test' }).applicantName).toMatch(/on one line/);
  });

  it('when herd counts are negative, fractional or missing, then each says what to enter', () => {
    const issues = issuesOf({ ...valid, does: -2, bucks: 1.5 });
    expect(issues.does).toMatch(/number of does/);
    expect(issues.bucks).toMatch(/whole number of bucks/);
    expect(issuesOf({ ...valid, does: Number.NaN }).does).toMatch(/0 if none/);
  });

  it('when an extra field is sent, then it is refused (no mass assignment)', () => {
    expect(applicationSchema.safeParse({ ...valid, status: 'approved' }).success).toBe(false);
  });

  it('when the queue is asked for without filters, then it defaults to pending, newest first, 20 a page', () => {
    expect(applicationListQuerySchema.parse({})).toEqual({ status: 'pending', q: '', sort: 'createdAt', dir: 'desc', page: 1, pageSize: 20 });
    expect(applicationListQuerySchema.parse({ page: '3', pageSize: '50' })).toMatchObject({ page: 3, pageSize: 50 });
    expect(applicationListQuerySchema.safeParse({ pageSize: '25' }).success).toBe(false);
  });

  it('when an invitation names a new farm or an existing one, then both forms parse; a mix does not', () => {
    const base = { name: 'Ivy Invitee', email: 'ivy@example.test', role: 'member' };
    expect(invitationSchema.safeParse({ ...base, farm: { kind: 'existing', farmId: valid.idempotencyKey } }).success).toBe(true);
    expect(
      invitationSchema.safeParse({ ...base, farm: { kind: 'new', name: 'Ivy Hollow', location: 'Tamsin County', timeZone: 'UTC', breedsKept: [] } }).success,
    ).toBe(true);
    expect(invitationSchema.safeParse({ ...base, farm: { kind: 'new', farmId: valid.idempotencyKey } }).success).toBe(false);
    expect(invitationSchema.safeParse({ ...base, role: 'apprentice', farm: { kind: 'existing', farmId: valid.idempotencyKey } }).success).toBe(false);
  });

  it('when an account is turned off without a reason, then it is refused', () => {
    expect(memberDisableSchema.safeParse({ reason: '  ', version: 0 }).success).toBe(false);
    expect(memberDisableSchema.safeParse({ reason: 'Left the co-op', version: 0 }).success).toBe(true);
  });
});
