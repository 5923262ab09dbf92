export const jobKeys = {
  all: ['jobs'] as const,
  list: (filters: Record<string, unknown>) => [...jobKeys.all, 'list', filters] as const,
  options: () => [...jobKeys.all, 'options'] as const,
  detail: (id: string) => [...jobKeys.all, 'detail', id] as const,
  checks: (id: string) => [...jobKeys.all, 'checks', id] as const,
  standards: () => [...jobKeys.all, 'standards'] as const,
};
