import { ApiRouter } from '../../http/api-router';
import type { AppDeps } from '../../app-deps';

/** Routes of the builds domain (filled in by its feature work). */
export function buildRoutes(deps: AppDeps): ApiRouter[] {
  return [new ApiRouter('/api/builds', deps)];
}
