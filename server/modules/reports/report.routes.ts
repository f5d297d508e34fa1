import { ApiRouter } from '../../http/api-router';
import type { AppDeps } from '../../app-deps';

/** Routes of the reports domain (filled in by its feature work). */
export function reportRoutes(deps: AppDeps): ApiRouter[] {
  return [new ApiRouter('/api/reports', deps)];
}
