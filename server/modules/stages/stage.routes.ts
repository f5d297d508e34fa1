import { ApiRouter } from '../../http/api-router';
import type { AppDeps } from '../../app-deps';

/** Routes of the stages domain (filled in by its feature work). */
export function stageRoutes(deps: AppDeps): ApiRouter[] {
  return [new ApiRouter('/api/stages', deps)];
}
