import { ApiRouter } from '../../http/api-router';
import type { AppDeps } from '../../app-deps';

/** Routes of the dynos domain (filled in by its feature work). */
export function dynoRoutes(deps: AppDeps): ApiRouter[] {
  return [new ApiRouter('/api/dynos', deps)];
}
