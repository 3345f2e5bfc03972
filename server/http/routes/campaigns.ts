import { campaignCreateSchema, campaignPatchSchema } from '../../services/campaigns/campaign-settings';
import {
  changeCampaign,
  createCampaign,
  getCampaign,
  listCampaigns,
} from '../../services/campaigns/manage-campaigns';
import { campaignCompleteness } from '../../services/completeness/campaign-completeness';
import type { AppDeps } from '../app-deps';
import { defineRoute } from '../define-route';
import { idParams } from '../schemas';

export const campaignRoutes = (deps: AppDeps) => [
  defineRoute({
    method: 'get',
    path: '/campaigns',
    access: 'scientist',
    summary: 'Every campaign, newest first, with counts of targets, light curves and snippets',
    handle: async () => ({ campaigns: await listCampaigns(deps.db) }),
  }),
  defineRoute({
    method: 'post',
    path: '/campaigns',
    access: 'scientist',
    summary: 'Create a campaign (draft) with its settings; missing settings take the defaults',
    body: campaignCreateSchema,
    status: 201,
    handle: async ({ person, body }) => ({ campaign: await createCampaign(deps.db, person!, body) }),
  }),
  defineRoute({
    method: 'get',
    path: '/campaigns/:id',
    access: 'scientist',
    summary: 'One campaign with its settings and counts',
    params: idParams,
    handle: async ({ params }) => ({ campaign: await getCampaign(deps.db, params.id) }),
  }),
  defineRoute({
    method: 'get',
    path: '/campaigns/:id/completeness',
    access: 'scientist',
    summary:
      'Recovery of planted dips per bin of planted SNR (expectedSnr), depth (ppm) and duration (hours), and the false-dip rate on quiet controls, each with its Wilson 95% interval. Controls still open or split count as pending, in no rate',
    params: idParams,
    handle: async ({ params }) => ({ completeness: await campaignCompleteness(deps.db, params.id) }),
  }),
  defineRoute({
    method: 'patch',
    path: '/campaigns/:id',
    access: 'scientist',
    summary:
      'Change settings and/or status (draft → live → paused → live; any → closed, which is final). New settings apply to snippets cut afterwards',
    params: idParams,
    body: campaignPatchSchema,
    handle: async ({ person, params, body }) => ({
      campaign: await changeCampaign(deps.db, person!, params.id, body),
    }),
  }),
];
