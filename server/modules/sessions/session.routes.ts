import { ApiRouter } from '../../http/api-router';
import type { AppDeps } from '../../app-deps';

/** Routes of the sessions domain (filled in by its feature work). */
export function sessionRoutes(deps: AppDeps): ApiRouter[] {
  return [new ApiRouter('/api/sessions', deps)];
}
