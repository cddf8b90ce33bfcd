export const chatKeys = {
  all: ['chat'] as const,
  threads: () => [...chatKeys.all, 'threads'] as const,
  thread: (threadId: string) => [...chatKeys.all, 'thread', threadId] as const,
  subject: (subjectType: string, subjectId: string) => [...chatKeys.all, 'subject', subjectType, subjectId] as const,
  people: (threadId: string, search: string) => [...chatKeys.all, 'people', threadId, search] as const,
  search: (q: string) => [...chatKeys.all, 'search', q] as const,
  mutes: () => [...chatKeys.all, 'mutes'] as const,
};
