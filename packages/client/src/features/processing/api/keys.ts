export const processingKeys = {
  all: ['processing'] as const,
  list: () => [...processingKeys.all, 'list'] as const,
};
