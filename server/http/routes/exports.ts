import { z } from 'zod';
import { writeExport } from '../../formats/stream';
import { campaignExport, type ExportKind } from '../../services/exports/campaign-exports';
import type { AppDeps } from '../app-deps';
import { defineRoute } from '../define-route';
import { idParams } from '../schemas';

const exportQuery = z
  .object({ format: z.enum(['csv', 'json', 'votable'], 'One of csv, json or votable').default('json') })
  .strict();

const exportRoute = (deps: AppDeps, kind: ExportKind, path: string, summary: string) =>
  defineRoute({
    method: 'get',
    path,
    access: 'scientist',
    summary,
    params: idParams,
    query: exportQuery,
    handle: async ({ params, query, person, res }) => {
      const download = await campaignExport(deps.db, person!, params.id, kind, query.format);
      res.status(200);
      res.type(download.contentType);
      res.setHeader('Content-Disposition', `attachment; filename="${download.fileName}"`);
      try {
        await writeExport(res, download.pieces);
      } catch (error) {
        // The headers are gone: all that is left is to cut the answer short, so it cannot pass as whole.
        deps.logger.error({ err: error, kind, campaignId: params.id }, 'export failed part-way');
        res.destroy(error as Error);
      }
    },
  });

export const exportRoutes = (deps: AppDeps) => [
  exportRoute(
    deps,
    'follow-up',
    '/campaigns/:id/follow-up',
    'The follow-up list as CSV, JSON or VOTable 1.4 (units and UCDs); candidates are not confirmed planets',
  ),
  exportRoute(
    deps,
    'consensus',
    '/campaigns/:id/consensus',
    'Every settled and ruled snippet with its consensus score, dip time and counts, as CSV, JSON or VOTable 1.4',
  ),
];
