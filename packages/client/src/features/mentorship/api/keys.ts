export const mentorshipKeys = {
  all: ['mentorship'] as const,
  home: () => [...mentorshipKeys.all, 'home'] as const,
  choices: () => [...mentorshipKeys.all, 'choices'] as const,
  log: (state: string) => [...mentorshipKeys.all, 'log', state] as const,
  queue: (apprenticeId: string, kind: string) => [...mentorshipKeys.all, 'queue', { apprenticeId, kind }] as const,
  apprentices: () => [...mentorshipKeys.all, 'apprentices'] as const,
  apprentice: (id: string) => [...mentorshipKeys.all, 'apprentice', id] as const,
  settings: () => [...mentorshipKeys.all, 'settings'] as const,
};
