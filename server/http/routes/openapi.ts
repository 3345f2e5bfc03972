import type { AppDeps } from '../app-deps';
import type { AnyRouteDef } from '../define-route';
import { defineRoute } from '../define-route';
import { buildOpenApi } from '../openapi';

export const openApiRoutes = (deps: AppDeps, allRoutes: () => AnyRouteDef[]) => {
  // The route table is fixed once the app is built, so the document is made once.
  let document: ReturnType<typeof buildOpenApi> | undefined;
  return [
    defineRoute({
      method: 'get',
      path: '/openapi.json',
      access: 'public',
      summary: 'This API reference as an OpenAPI 3.1 document',
      handle: async () => {
        document ??= buildOpenApi(allRoutes(), { version: '0.1.0', serverUrl: deps.config.publicUrl });
        return document;
      },
    }),
  ];
};
