/**
 * Every domain's routers, in mount order. A new domain adds one line here; each router lists
 * its routes with their access rule (see http/api-router.ts).
 */
import type { AppDeps } from '../app-deps';
import type { ApiRouter } from '../http/api-router';
import { healthRoutes } from './health/health.routes';
import { authRoutes } from './auth/auth.routes';
import { userRoutes } from './users/user.routes';
import { shopRoutes } from './shops/shop.routes';
import { shopLogoRoutes } from './shops/shop-logo.routes';
import { customerRoutes } from './customers/customer.routes';
import { bikeRoutes } from './bikes/bike.routes';
import { auditRoutes } from './audit/audit.routes';
import { outboxRoutes } from './outbox/outbox.routes';
import { dynoRoutes } from './dynos/dyno.routes';
import { sessionRoutes } from './sessions/session.routes';
import { stageRoutes } from './stages/stage.routes';
import { runRoutes } from './runs/run.routes';
import { comparisonRoutes } from './comparisons/comparison.routes';
import { reportRoutes } from './reports/report.routes';
import { buildRoutes } from './builds/build.routes';
import { deviceRoutes } from './device/device.routes';
import { planRoutes } from './plans/plan.routes';

export function allRouters(deps: AppDeps): ApiRouter[] {
  return [
    healthRoutes(deps),
    authRoutes(deps),
    userRoutes(deps),
    shopRoutes(deps),
    customerRoutes(deps),
    bikeRoutes(deps),
    auditRoutes(deps),
    outboxRoutes(deps),
    ...dynoRoutes(deps),
    ...sessionRoutes(deps),
    ...stageRoutes(deps),
    ...deviceRoutes(deps), // before runs: /api/runs/inbox
    ...runRoutes(deps),
    ...comparisonRoutes(deps),
    ...reportRoutes(deps),
    shopLogoRoutes(deps),
    ...buildRoutes(deps),
    ...planRoutes(deps),
  ];
}
