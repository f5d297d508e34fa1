import { ApiRouter } from '../../http/api-router';
import type { AppDeps } from '../../app-deps';
import { STAFF } from '@shared/roles';
import { idParams } from '@shared/schemas/common';
import { customerInput, customerListQuery } from '@shared/schemas/customer';
import { createCustomer, deleteCustomer, getCustomer, listCustomers, updateCustomer } from './customer.service';

const FRONT = ['owner', 'desk'] as const;

export function customerRoutes(deps: AppDeps) {
  const api = new ApiRouter('/api/customers', deps);
  api.route({ method: 'get', path: '/', access: STAFF, summary: 'Search customers', query: customerListQuery, handler: ({ em, actor, query }) => listCustomers(em, actor, query) });
  api.route({ method: 'post', path: '/', access: FRONT, summary: 'Create a customer', body: customerInput, status: 201, handler: ({ em, actor, body }) => createCustomer(em, actor, body) });
  api.route({ method: 'get', path: '/:id', access: 'signed-in', summary: 'One customer (customers: only themselves)', params: idParams, handler: ({ em, actor, params }) => getCustomer(em, actor, params.id) });
  api.route({ method: 'put', path: '/:id', access: FRONT, summary: 'Edit a customer', params: idParams, body: customerInput, handler: ({ em, actor, params, body }) => updateCustomer(em, actor, params.id, body) });
  api.route({ method: 'delete', path: '/:id', access: ['owner'], summary: 'Delete a customer without bikes', params: idParams, handler: ({ em, actor, params }) => deleteCustomer(em, actor, params.id) });
  return api;
}
