import type { AppDeps } from './app-deps';
import type { AnyRouteDef } from './define-route';
import { adminPeopleRoutes } from './routes/admin-people';
import { authRoutes } from './routes/auth';
import { healthRoutes } from './routes/health';
import { jobRoutes } from './routes/jobs';

/** Every API route, with its access rule. The authorisation tests and the API reference read this. */
export function routeTable(deps: AppDeps): AnyRouteDef[] {
  return [...healthRoutes(deps), ...authRoutes(deps), ...adminPeopleRoutes(deps), ...jobRoutes(deps)];
}
