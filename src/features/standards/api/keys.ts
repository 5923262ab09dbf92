export const standardKeys = {
  all: ['standards'] as const,
  list: (filters: Record<string, string | undefined>) => [...standardKeys.all, 'list', filters] as const,
  detail: (id: string) => [...standardKeys.all, 'detail', id] as const,
};
