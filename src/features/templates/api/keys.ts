export const templateKeys = {
  all: ['templates'] as const,
  list: () => [...templateKeys.all, 'list'] as const,
  version: (id: string) => [...templateKeys.all, 'version', id] as const,
};
