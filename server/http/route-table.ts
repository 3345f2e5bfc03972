import type { AppDeps } from './app-deps';
import type { AnyRouteDef } from './define-route';
import { adminOutboxRoutes } from './routes/admin-outbox';
import { adminPeopleRoutes } from './routes/admin-people';
import { auditRoutes } from './routes/audit';
import { authRoutes } from './routes/auth';
import { campaignRoutes } from './routes/campaigns';
import { candidateRoutes } from './routes/candidates';
import { deckRoutes } from './routes/deck';
import { deskRoutes } from './routes/desk';
import { exportRoutes } from './routes/exports';
import { healthRoutes } from './routes/health';
import { jobRoutes } from './routes/jobs';
import { labRoutes } from './routes/lab';
import { newsletterRoutes } from './routes/newsletters';
import { openApiRoutes } from './routes/openapi';
import { tokenRoutes } from './routes/tokens';
import { unsubscribeRoutes } from './routes/unsubscribe';

/** Every API route, with its access rule. The authorisation tests and the API reference read this. */
export function routeTable(deps: AppDeps): AnyRouteDef[] {
  const routes: AnyRouteDef[] = [
    ...healthRoutes(deps),
    ...authRoutes(deps),
    ...adminPeopleRoutes(deps),
    ...adminOutboxRoutes(deps),
    ...jobRoutes(deps),
    ...tokenRoutes(deps),
    ...campaignRoutes(deps),
    ...candidateRoutes(deps),
    ...exportRoutes(deps),
    ...labRoutes(deps),
    ...deckRoutes(deps),
    ...deskRoutes(deps),
    ...auditRoutes(deps),
    ...unsubscribeRoutes(deps),
    ...newsletterRoutes(deps),
  ];
  return [...routes, ...openApiRoutes(deps, () => routes)];
}
