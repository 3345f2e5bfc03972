import { z } from 'zod';
import { vetTarget } from '../../services/candidates/vet-target';
import { latestPeriodSearchOf, requestPeriodSearch } from '../../services/period-search/period-search';
import { getSnippet, listSnippets, markSnippetQuiet } from '../../services/snippets/read-snippets';
import { importCatalogue } from '../../services/targets/import-catalogue';
import { getTarget, listTargets } from '../../services/targets/read-targets';
import { createUploads } from '../../services/uploads/create-uploads';
import { getUpload, listCampaignUploads } from '../../services/uploads/upload-view';
import type { AppDeps } from '../app-deps';
import { defineRoute } from '../define-route';
import { catalogueUpload, lightCurveUpload } from '../multipart';
import { idParams, pagination } from '../schemas';

const lightCurveFields = z.object({
  target: z.string().trim().min(1).max(64).optional(),
  quietReference: z.enum(['true', 'false', 'on', '1', '0']).optional(),
});

const snippetQuery = z.object({
  state: z.enum(['open', 'settled', 'split', 'ruled']).optional(),
  kind: z.enum(['real', 'planted', 'quiet']).optional(),
  target: z.string().trim().min(1).max(64).optional(),
  sort: z.enum(['id', 'timeStart', 'verdictCount', 'consensusScore']).default('id'),
  order: z.enum(['asc', 'desc']).default('asc'),
  ...pagination.shape,
});

const targetQuery = z.object({ q: z.string().trim().max(64).optional(), ...pagination.shape });

export const labRoutes = (deps: AppDeps) => [
  defineRoute({
    method: 'post',
    path: '/campaigns/:id/targets',
    access: 'scientist',
    summary:
      'Upload a target catalogue (CSV: designation, ra, dec, magnitude, stellar_radius, stellar_mass, teff); insert or update by designation, with a report per row',
    params: idParams,
    multipart: { fileField: 'file', multiple: false },
    before: [catalogueUpload('file')],
    handle: async ({ req, person, params }) => importCatalogue(deps.db, person!, params.id, req.file?.buffer),
  }),
  defineRoute({
    method: 'get',
    path: '/campaigns/:id/targets',
    access: 'scientist',
    summary:
      "The campaign's targets with their ids and designations, and how many light curves and snippets each has",
    params: idParams,
    query: targetQuery,
    handle: async ({ params, query }) => listTargets(deps.db, params.id, query),
  }),
  defineRoute({
    method: 'post',
    path: '/campaigns/:id/light-curves',
    access: 'scientist',
    summary:
      'Upload light curves (CSV or FITS, up to 20 files of 100 MB); answers 202 with one upload id per file',
    params: idParams,
    body: lightCurveFields,
    multipart: { fileField: 'files', multiple: true, fields: lightCurveFields },
    before: [lightCurveUpload(deps.config.dataDir, 'files')],
    status: 202,
    handle: async ({ req, person, params, body }) => {
      const files = ((req.files as Express.Multer.File[] | undefined) ?? []).map((file) => ({
        path: file.path,
        originalName: Buffer.from(file.originalname, 'latin1').toString('utf8'),
        sizeBytes: file.size,
      }));
      const uploads = await createUploads(
        deps.db,
        deps.queues,
        deps.config.dataDir,
        person!,
        params.id,
        files,
        {
          target: body.target,
          quietReference:
            body.quietReference === 'true' || body.quietReference === 'on' || body.quietReference === '1',
        },
      );
      return {
        uploads: uploads.map(({ id, fileName, status, duplicate }) => ({ id, fileName, status, duplicate })),
      };
    },
  }),
  defineRoute({
    method: 'get',
    path: '/campaigns/:id/uploads',
    access: 'scientist',
    summary: "The campaign's latest uploads with their status",
    params: idParams,
    handle: async ({ params }) => ({ uploads: await listCampaignUploads(deps.db, params.id) }),
  }),
  defineRoute({
    method: 'get',
    path: '/uploads/:id',
    access: 'scientist',
    summary:
      'An upload: status (queued, processing, done, failed), stage, progress 0–1, error and snippet count',
    params: idParams,
    handle: async ({ params }) => getUpload(deps.db, params.id),
  }),
  defineRoute({
    method: 'get',
    path: '/campaigns/:id/snippets',
    access: 'scientist',
    summary: 'Browse snippets: filter by state, kind and target; sort; paginate',
    params: idParams,
    query: snippetQuery,
    handle: async ({ params, query }) => listSnippets(deps.db, params.id, query),
  }),
  defineRoute({
    method: 'get',
    path: '/snippets/:id',
    access: 'scientist',
    summary:
      'One snippet with its series (at most 600 points), its kind and, for a planted control, the truth',
    params: idParams,
    handle: async ({ params }) => ({ snippet: await getSnippet(deps.db, params.id) }),
  }),
  defineRoute({
    method: 'post',
    path: '/snippets/:id/quiet',
    access: 'scientist',
    summary: 'Mark an open real snippet as holding no transit: it becomes a quiet control',
    params: idParams,
    handle: async ({ params, person }) => ({
      snippet: await markSnippetQuiet(deps.db, person!.id, params.id),
    }),
  }),
  defineRoute({
    method: 'get',
    path: '/targets/:id',
    access: 'scientist',
    summary: 'A target with its whole light curves, snippet boundaries, planted transits and consensus',
    params: idParams,
    handle: async ({ params }) => getTarget(deps.db, params.id),
  }),
  defineRoute({
    method: 'post',
    path: '/targets/:id/period-search',
    access: 'scientist',
    summary: 'Start a period search (BLS) of the target’s light curves as a worker job; 202 with the job',
    params: idParams,
    body: periodSearchBody,
    status: 202,
    handle: ({ params, body, person }) =>
      requestPeriodSearch(deps.db, deps.queues, person!, params.id, body ?? {}),
  }),
  defineRoute({
    method: 'get',
    path: '/targets/:id/vetting',
    access: 'scientist',
    summary:
      'Derived parameters (Rp, a, a/R★, T_eq, transit probability) and vetting diagnostics, each pass or warn',
    params: idParams,
    handle: ({ params }) => vetTarget(deps.db, params.id),
  }),
  defineRoute({
    method: 'get',
    path: '/targets/:id/period-search',
    access: 'scientist',
    summary:
      'The latest period search of a target (null before the first): its state, or its result (period, t0, depth, duration, SNR, diagnostics)',
    params: idParams,
    handle: ({ params }) => latestPeriodSearchOf(deps.db, deps.queues, params.id),
  }),
];

const periodSearchBody = z
  .object({
    minPeriodDays: z.number().min(0.1).max(1_000).optional(),
    maxPeriodDays: z.number().min(0.2).max(10_000).optional(),
    oversample: z.number().min(0.25).max(10).optional(),
  })
  .strict()
  .optional();
