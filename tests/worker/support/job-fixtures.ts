// Data for real ingest and consensus jobs, and their results in a form two runs can be compared in.
import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { createCampaign } from '../../../seeds/factories/campaigns';
import { createSnippetFixtures } from '../../../seeds/factories/snippets';
import type { Db } from '../../../server/db/knex';
import { nowIso } from '../../../server/db/rows';
import { upsertTarget } from '../../../server/db/targets';
import { insertUpload } from '../../../server/db/uploads';

// An invented light curve from tests/reference/make_reference.py.
const FIXTURE = path.resolve(import.meta.dirname, '../../fixtures/reference/hot-jupiter.fits');

/** A live campaign with the fixture's target and the fixture uploaded, not yet ingested. */
export async function uploadInNewCampaign(
  db: Db,
  personId: number,
): Promise<{ uploadId: number; campaignId: number }> {
  const campaignId = await createCampaign(db, { status: 'live' });
  await upsertTarget(db, campaignId, {
    designation: 'DPD-0417-3021',
    raDeg: 217.4,
    decDeg: -62.7,
    magnitude: 11,
    stellarRadiusRsun: 1.1,
    stellarMassMsun: 1.05,
    teffK: 5900,
    assumedFields: [],
  });
  const { upload } = await insertUpload(db, {
    campaignId,
    uploadedBy: personId,
    contentHash: 'hash-of-the-fixture', // the same file in each campaign: the same planted controls
    originalName: 'hot-jupiter.fits',
    format: 'fits',
    sizeBytes: fs.statSync(FIXTURE).size,
    storagePath: FIXTURE,
    targetHint: null,
    isQuietReference: false,
  });
  return { uploadId: upload.id, campaignId };
}

/** A campaign's light curves and snippets, without ids or clocks: each snippet once, or a duplicate shows. */
export async function ingestedSignature(db: Db, campaignId: number) {
  const lightCurves = await db('light_curves').where({ campaign_id: campaignId }).count({ n: '*' });
  const snippets = await db('snippets')
    .where({ campaign_id: campaignId })
    .orderBy(['time_start', 'kind', 'id'])
    .select('kind', 'time_start', 'time_end', 'point_count', 'planted_truth');
  return {
    lightCurves: Number(lightCurves[0]!.n),
    snippets: snippets.map(
      (row) =>
        `${row.kind} ${Number(row.time_start).toFixed(6)}–${Number(row.time_end).toFixed(6)} ${row.point_count} ${row.planted_truth ?? ''}`,
    ),
  };
}

export const CONSENSUS_SNIPPETS = { real: 500, planted: 60, quiet: 40 };

/**
 * Snippets and verdicts for a rescore of several batches: clear dips (marked), clear flats, even
 * splits, too few verdicts, planted controls mostly found and quiet ones that one careless volunteer
 * calls dips. The same call on two campaigns gives them the same data. Nothing is marked for rescore.
 */
export async function seedVerdicts(db: Db, campaignId: number, people: number[]): Promise<void> {
  const { snippetIds } = await createSnippetFixtures(db, campaignId, { targets: 10, ...CONSENSUS_SNIPPETS });
  const now = nowIso();
  const verdicts: Record<string, unknown>[] = [];
  const verdict = (snippetId: number, personId: number, answer: string, markTime: number | null = null) => {
    verdicts.push({
      client_id: randomUUID(),
      snippet_id: snippetId,
      person_id: personId,
      answer,
      mark_time: markTime,
      created_at: now,
      updated_at: now,
    });
  };
  const starts = new Map(
    (await db('snippets').where({ campaign_id: campaignId }).select('id', 'time_start')).map((row) => [
      Number(row.id),
      Number(row.time_start),
    ]),
  );
  snippetIds.real.forEach((snippetId, index) => {
    const middle = starts.get(snippetId)! + 1;
    people.forEach((personId, p) => {
      if (index % 10 === 0) verdict(snippetId, personId, 'dip', middle + (p - 3) * 0.01);
      else if (index % 10 === 1) verdict(snippetId, personId, p % 2 ? 'dip' : 'flat', p % 2 ? middle : null);
      else if (index % 10 === 2) {
        if (p < 3) verdict(snippetId, personId, 'flat');
      } else verdict(snippetId, personId, p === 0 && index % 3 === 0 ? 'unsure' : 'flat');
    });
  });
  for (const snippetId of snippetIds.planted) {
    for (const [p, personId] of people.entries()) {
      verdict(snippetId, personId, p === people.length - 1 ? 'flat' : 'dip');
    }
  }
  for (const snippetId of snippetIds.quiet) {
    for (const [p, personId] of people.entries()) verdict(snippetId, personId, p === 0 ? 'dip' : 'flat');
  }
  for (let i = 0; i < verdicts.length; i += 400) await db('verdicts').insert(verdicts.slice(i, i + 400));
}

/** The campaign's consensus with snippets by position, not id, so two campaigns' can be compared. */
export async function consensusSignature(db: Db, campaignId: number) {
  const snippets = await db('snippets')
    .where({ campaign_id: campaignId })
    .orderBy('id')
    .select(
      'id',
      'state',
      'outcome',
      'split_reason',
      'consensus_score',
      'dip_share',
      'effective_votes',
      'needs_rescore',
    );
  const position = new Map(snippets.map((row, index) => [Number(row.id), index]));
  const dips = await db('dips')
    .where({ campaign_id: campaignId })
    .orderBy(['snippet_id', 'cluster_index'])
    .select(
      'id',
      'snippet_id',
      'cluster_index',
      'time_center',
      'time_sigma',
      'depth_ppm',
      'duration_hours',
      'snr',
      'mark_count',
      'consensus_score',
    );
  const finders = await db('dip_finders')
    .join('dips', 'dips.id', 'dip_finders.dip_id')
    .where('dips.campaign_id', campaignId)
    .orderBy(['dips.snippet_id', 'dips.cluster_index', 'dip_finders.person_id'])
    .select('dips.snippet_id', 'dips.cluster_index', 'dip_finders.person_id');
  const reliability = await db('reliability')
    .where({ campaign_id: campaignId })
    .orderBy('person_id')
    .select(
      'person_id',
      'sensitivity',
      'specificity',
      'weight_dip',
      'weight_flat',
      'planted_seen',
      'planted_found',
      'quiet_seen',
    );
  return {
    snippets: snippets.map(({ id, needs_rescore, ...row }) => ({
      at: position.get(Number(id)),
      ...row,
      needs_rescore: Boolean(needs_rescore),
    })),
    dips: dips.map(({ id: _id, snippet_id, ...row }) => ({ at: position.get(Number(snippet_id)), ...row })),
    finders: finders.map(
      (row) => `${position.get(Number(row.snippet_id))}/${row.cluster_index}/${row.person_id}`,
    ),
    reliability,
  };
}
