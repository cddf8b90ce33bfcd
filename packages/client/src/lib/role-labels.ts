import type { Role } from '@burrowline/shared';

export const roleLabels: Record<Role, string> = {
  admin: 'Admin',
  member: 'Member',
  apprentice: 'Apprentice',
};
