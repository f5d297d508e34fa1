import { ApiRouter } from '../../http/api-router';
import type { AppDeps } from '../../app-deps';

/** Routes of the comparisons domain (filled in by its feature work). */
export function comparisonRoutes(deps: AppDeps): ApiRouter[] {
  return [new ApiRouter('/api/comparisons', deps)];
}
