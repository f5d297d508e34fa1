import { ApiRouter } from '../../http/api-router';
import type { AppDeps } from '../../app-deps';

/** Routes of the runs domain (filled in by its feature work). */
export function runRoutes(deps: AppDeps): ApiRouter[] {
  return [new ApiRouter('/api/runs', deps)];
}
