export const healthKeys = {
  all: ['health'] as const,
  treatments: () => [...healthKeys.all, 'treatments'] as const,
  withdrawals: (subject: { animalId?: string; groupId?: string }) => [...healthKeys.all, 'withdrawals', subject] as const,
  temperatures: () => [...healthKeys.all, 'temperatures'] as const,
  heat: () => [...healthKeys.all, 'heat'] as const,
};
