import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import {
  customerListSchema,
  customerResponseSchema,
  type ContactInput,
  type CustomerInput,
  type ItemInput,
} from '../../../../shared/schemas/customers.schema';
import { api } from '../../../lib/api-client';

export const customerKeys = {
  all: ['customers'] as const,
  list: () => [...customerKeys.all, 'list'] as const,
  detail: (id: string) => [...customerKeys.all, 'detail', id] as const,
};

/** `GET /api/customers`. */
export const customersQueryOptions = () =>
  queryOptions({ queryKey: customerKeys.list(), queryFn: async ({ signal }) => (await api.get('/api/customers', { schema: customerListSchema, signal })).customers });
export const useCustomers = () => useQuery(customersQueryOptions());

/** `GET /api/customers/:id` with contacts and items. */
export const customerQueryOptions = (id: string) =>
  queryOptions({ queryKey: customerKeys.detail(id), queryFn: async ({ signal }) => (await api.get(`/api/customers/${id}`, { schema: customerResponseSchema, signal })).customer });
export const useCustomer = (id: string) => useQuery(customerQueryOptions(id));

/** Every change to a customer, its contacts or items: the mutation, then a refresh of the customer. */
export function useCustomerChange<T>(send: (input: T) => Promise<unknown>) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: send, onSuccess: () => qc.invalidateQueries({ queryKey: customerKeys.all }) });
}

export const createCustomer = (input: CustomerInput) => api.post('/api/customers', input, { schema: customerResponseSchema });
export const updateCustomer = (id: string) => (input: CustomerInput) => api.put(`/api/customers/${id}`, input);
export const addContact = (id: string) => (input: ContactInput) => api.post(`/api/customers/${id}/contacts`, input);
export const updateContact = (id: string, contactId: string) => (input: ContactInput) => api.put(`/api/customers/${id}/contacts/${contactId}`, input);
export const removeContact = (id: string) => (contactId: string) => api.delete(`/api/customers/${id}/contacts/${contactId}`);
export const addItem = (id: string) => (input: ItemInput) => api.post(`/api/customers/${id}/items`, input);
