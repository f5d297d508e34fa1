import { z } from 'zod';
import { ApiRouter } from '../../http/api-router';
import type { AppDeps } from '../../app-deps';
import { listAudit } from './audit.service';

export function auditRoutes(deps: AppDeps) {
  const api = new ApiRouter('/api/audit', deps);
  api.route({
    method: 'get',
    path: '/',
    access: ['owner'],
    summary: 'The shop’s audit log, newest first',
    query: z.object({
      before: z.string().datetime().optional(),
      limit: z.coerce.number().int().min(1).max(500).default(100),
      /** Comma-separated action kinds, e.g. "run,column-layout". */
      kinds: z
        .string()
        .regex(/^[a-z-]+(,[a-z-]+)*$/, 'Kinds are lower-case words separated by commas')
        .transform((s) => s.split(','))
        .optional(),
    }),
    handler: ({ em, actor, query }) => listAudit(em, actor, query),
  });
  return api;
}
