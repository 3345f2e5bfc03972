import { z } from 'zod';
import { CANDIDATE_STATES, DISPOSITIONS } from '../../db/candidates';
import {
  campaignCandidates,
  campaignDipTargets,
  candidateDetail,
  changeCandidate,
  promoteCandidate,
} from '../../services/candidates/manage-candidates';
import {
  addObservatory,
  candidateWindows,
  changeObservatory,
  observatories,
  removeObservatory,
} from '../../services/candidates/transit-windows';
import type { AppDeps } from '../app-deps';
import { defineRoute } from '../define-route';
import { idParams, rowId } from '../schemas';

const promoteBody = z
  .object({
    targetId: rowId,
    dipIds: z.array(rowId).max(500).optional(),
    notes: z.string().max(5_000).nullable().optional(),
    telescopePrecisionPpm: z.number().positive().max(1_000_000).optional(),
  })
  .strict();

const changeBody = z
  .object({
    state: z.enum(CANDIDATE_STATES, `One of ${CANDIDATE_STATES.join(', ')}`).optional(),
    disposition: z.enum(DISPOSITIONS, `One of ${DISPOSITIONS.join(', ')}`).optional(),
    notes: z.string().max(5_000).nullable().optional(),
  })
  .strict()
  .refine((body) => Object.keys(body).length > 0, { message: 'Change at least one field', path: ['state'] });

export const candidateRoutes = (deps: AppDeps) => [
  defineRoute({
    method: 'post',
    path: '/campaigns/:id/candidates',
    access: 'scientist',
    summary:
      'Promote a target (with chosen dips) to the follow-up list; candidates are not confirmed planets',
    params: idParams,
    body: promoteBody,
    status: 201,
    handle: ({ params, body, person }) => promoteCandidate(deps.db, person!, params.id, body),
  }),
  defineRoute({
    method: 'get',
    path: '/campaigns/:id/dip-targets',
    access: 'scientist',
    summary:
      'Targets with settled dips, ranked by best SNR, number of dips and consensus: the candidate review',
    params: idParams,
    handle: ({ params }) => campaignDipTargets(deps.db, params.id),
  }),
  defineRoute({
    method: 'get',
    path: '/campaigns/:id/candidates',
    access: 'scientist',
    summary: 'The campaign’s follow-up list, highest priority first, with the volunteers credited',
    params: idParams,
    handle: ({ params }) => campaignCandidates(deps.db, params.id),
  }),
  defineRoute({
    method: 'get',
    path: '/candidates/:id',
    access: 'scientist',
    summary: 'One candidate: its ephemeris, state, disposition, notes, dips and the volunteers credited',
    params: idParams,
    handle: ({ params }) => candidateDetail(deps.db, params.id),
  }),
  defineRoute({
    method: 'patch',
    path: '/candidates/:id',
    access: 'scientist',
    summary: 'Move a candidate through promoted → scheduled → observed → resolved, or set its disposition',
    params: idParams,
    body: changeBody,
    handle: ({ params, body, person }) => changeCandidate(deps.db, person!, params.id, body),
  }),
  defineRoute({
    method: 'get',
    path: '/candidates/:id/windows',
    access: 'scientist',
    summary:
      'The next transit windows (BJD_TDB and UTC, padded by their uncertainty) and, per observatory, whether each is observable',
    params: idParams,
    query: z.object({ count: z.coerce.number().int().min(1).max(100).default(10) }).strict(),
    handle: ({ params, query }) => candidateWindows(deps.db, params.id, query.count),
  }),
  defineRoute({
    method: 'get',
    path: '/observatories',
    access: 'scientist',
    summary: 'The observatories transit windows are planned for',
    handle: () => observatories(deps.db),
  }),
  defineRoute({
    method: 'post',
    path: '/observatories',
    access: 'scientist',
    summary: 'Add an observatory: where it is, its lowest target altitude and its Sun altitude limit',
    body: observatoryBody,
    status: 201,
    handle: ({ body, person }) => addObservatory(deps.db, person!, body),
  }),
  defineRoute({
    method: 'patch',
    path: '/observatories/:id',
    access: 'scientist',
    summary: 'Change an observatory: its name, place, lowest target altitude or Sun altitude limit',
    params: idParams,
    body: observatoryChangeBody,
    handle: ({ params, body, person }) => changeObservatory(deps.db, person!, params.id, body),
  }),
  defineRoute({
    method: 'delete',
    path: '/observatories/:id',
    access: 'scientist',
    summary: 'Remove an observatory: windows are no longer planned for it',
    params: idParams,
    handle: ({ params, person }) => removeObservatory(deps.db, person!, params.id),
  }),
];

const observatoryBody = z
  .object({
    name: z.string().trim().min(1).max(120),
    latitudeDeg: z.number().min(-90).max(90),
    longitudeDeg: z.number().min(-180).max(180),
    elevationM: z.number().min(-500).max(9_000).default(0),
    minTargetAltitudeDeg: z.number().min(0).max(89).default(30),
    sunAltitudeLimitDeg: z.number().min(-90).max(0).default(-12),
  })
  .strict();

const observatoryChangeBody = observatoryBody
  .extend({
    elevationM: observatoryBody.shape.elevationM.removeDefault(),
    minTargetAltitudeDeg: observatoryBody.shape.minTargetAltitudeDeg.removeDefault(),
    sunAltitudeLimitDeg: observatoryBody.shape.sunAltitudeLimitDeg.removeDefault(),
  })
  .partial()
  .strict()
  .refine((body) => Object.keys(body).length > 0, { message: 'Change at least one field', path: ['name'] });
