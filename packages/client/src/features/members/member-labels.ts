import type { MemberStatus, Role } from '@burrowline/shared';
import type { BadgeTone } from '../../components/ui/badge';

export const memberStatusLabels: Record<MemberStatus, string> = {
  active: 'Active',
  invited: 'Invited',
  awaiting_password: 'No password yet',
  disabled: 'Turned off',
};

export const memberStatusTones: Record<MemberStatus, BadgeTone> = {
  active: 'moss',
  invited: 'straw',
  awaiting_password: 'straw',
  disabled: 'clay',
};

export const roleDescriptions: Record<Role, string> = {
  admin: "Runs the co-op: applications, members, rules, processing days. Keeps their own farm's herd too.",
  member: "Keeps their farm's herd; lends and borrows bucks, trades, books processing places.",
  apprentice: "Learns under a mentor on the mentor's farm; never sells, lends, books or sees money.",
};
