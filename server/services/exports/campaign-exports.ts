import { appendAudit } from '../../db/audit-log';
import { findCampaignById } from '../../db/campaigns';
import { consensusRows, followUpRows } from '../../db/exports';
import type { Db } from '../../db/knex';
import type { PersonRow } from '../../db/people';
import { notFound } from '../../errors';
import { type Column, type ExportRows, UCD, UNIT } from '../../formats/columns';
import { csvLines } from '../../formats/csv';
import { jsonChunks } from '../../formats/json';
import { votableChunks } from '../../formats/votable';

export type ExportFormat = 'csv' | 'json' | 'votable';
export type ExportKind = 'follow-up' | 'consensus';

export const FOLLOW_UP_COLUMNS: Column[] = [
  { name: 'candidate_id', type: 'int', ucd: UCD.id, description: 'Dipdeck candidate id' },
  {
    name: 'designation',
    type: 'char',
    ucd: UCD.mainId,
    description: 'Target designation in the campaign catalogue',
  },
  { name: 'ra', type: 'double', unit: UNIT.degrees, ucd: UCD.ra, description: 'Right ascension (ICRS)' },
  { name: 'dec', type: 'double', unit: UNIT.degrees, ucd: UCD.dec, description: 'Declination (ICRS)' },
  {
    name: 'magnitude',
    type: 'double',
    unit: UNIT.magnitude,
    ucd: UCD.magnitude,
    description: 'Catalogue magnitude',
  },
  {
    name: 'state',
    type: 'char',
    ucd: UCD.disposition,
    description: 'promoted, scheduled, observed or resolved',
  },
  {
    name: 'disposition',
    type: 'char',
    ucd: UCD.disposition,
    description: 'planet candidate, eclipsing binary, systematic, false positive or confirmed planet',
  },
  {
    name: 'period',
    type: 'double',
    unit: UNIT.days,
    ucd: UCD.period,
    description: 'Orbital period (empty for a single transit)',
  },
  {
    name: 'period_err',
    type: 'double',
    unit: UNIT.days,
    ucd: UCD.periodError,
    description: 'Period uncertainty (1σ)',
  },
  {
    name: 't0_bjd_tdb',
    type: 'double',
    unit: UNIT.days,
    ucd: UCD.epoch,
    description: 'Mid-transit time, BJD_TDB',
  },
  {
    name: 't0_err',
    type: 'double',
    unit: UNIT.days,
    ucd: UCD.epochError,
    description: 'Mid-transit time uncertainty (1σ)',
  },
  { name: 'depth', type: 'double', unit: UNIT.ppm, ucd: UCD.depth, description: 'Transit depth' },
  {
    name: 'duration',
    type: 'double',
    unit: UNIT.hours,
    ucd: UCD.duration,
    description: 'Transit duration T14',
  },
  { name: 'snr', type: 'double', ucd: UCD.snr, description: 'Signal-to-noise ratio of the transit(s)' },
  { name: 'priority', type: 'double', description: 'Dipdeck follow-up priority (higher first)' },
  {
    name: 'dip_count',
    type: 'int',
    ucd: UCD.count,
    description: 'Dips from the volunteers behind this candidate',
  },
  {
    name: 'credited',
    type: 'char',
    ucd: UCD.note,
    description: 'Volunteers who found the dips and agreed to be named',
  },
];

export const CONSENSUS_COLUMNS: Column[] = [
  { name: 'snippet_id', type: 'int', ucd: UCD.mainId, description: 'Dipdeck snippet id' },
  { name: 'designation', type: 'char', ucd: UCD.id, description: 'Target designation' },
  {
    name: 'kind',
    type: 'char',
    ucd: UCD.disposition,
    description: 'real, planted (a control with a synthetic transit) or quiet (a control without)',
  },
  { name: 'state', type: 'char', ucd: UCD.disposition, description: 'settled or ruled' },
  { name: 'outcome', type: 'char', ucd: UCD.disposition, description: 'dip or flat' },
  {
    name: 'time_start',
    type: 'double',
    unit: UNIT.days,
    ucd: UCD.windowStart,
    description: 'Snippet start in the light curve’s time',
  },
  {
    name: 'time_end',
    type: 'double',
    unit: UNIT.days,
    ucd: UCD.windowEnd,
    description: 'Snippet end in the light curve’s time',
  },
  {
    name: 'consensus_score',
    type: 'double',
    ucd: UCD.probability,
    description: 'Posterior probability of a dip from reliability-weighted verdicts',
  },
  { name: 'dip_share', type: 'double', description: 'Plain share of dip verdicts' },
  { name: 'verdicts', type: 'int', ucd: UCD.count, description: 'Counting verdicts' },
  { name: 'effective_votes', type: 'double', description: 'Kish effective number of votes' },
  {
    name: 'dip_time',
    type: 'double',
    unit: UNIT.days,
    ucd: UCD.epoch,
    description: 'Dip centre from the volunteers’ marks (first dip), light curve’s time',
  },
  {
    name: 'dip_time_err',
    type: 'double',
    unit: UNIT.days,
    ucd: UCD.epochError,
    description: 'Spread of the marks (1.4826 × weighted MAD)',
  },
  {
    name: 'dip_depth',
    type: 'double',
    unit: UNIT.ppm,
    ucd: UCD.depth,
    description: 'Depth measured around the mark',
  },
  {
    name: 'dip_duration',
    type: 'double',
    unit: UNIT.hours,
    ucd: UCD.duration,
    description: 'Duration measured around the mark',
  },
];

const CONTENT_TYPES: Record<ExportFormat, string> = {
  csv: 'text/csv; charset=utf-8; header=present',
  json: 'application/json; charset=utf-8',
  votable: 'application/x-votable+xml; charset=utf-8',
};
const EXTENSIONS: Record<ExportFormat, string> = { csv: 'csv', json: 'json', votable: 'vot' };

function pieces(
  format: ExportFormat,
  kind: ExportKind,
  columns: Column[],
  rows: ExportRows,
  campaign: { id: number; name: string },
) {
  const exportedAt = new Date();
  if (format === 'csv') {
    return csvLines(columns, rows, {
      preamble: [
        `campaign: ${campaign.name} (id ${campaign.id})`,
        `exported at: ${exportedAt.toISOString()}`,
      ],
    });
  }
  if (format === 'json') return jsonChunks(columns, rows, { campaign, exportedAt });
  return votableChunks(columns, rows, {
    tableName: kind === 'follow-up' ? 'follow_up_list' : 'consensus_list',
    campaign,
    exportedAt,
    description:
      kind === 'follow-up'
        ? `Dipdeck follow-up list of campaign ${campaign.name}.`
        : `Dipdeck consensus list (settled and ruled snippets) of campaign ${campaign.name}.`,
  });
}

/**
 * An export of one campaign, ready to stream: its content type, file name and pieces. Rows are read
 * page by page, so memory stays flat however long the list. The download is audit-logged.
 */
export async function campaignExport(
  db: Db,
  person: PersonRow,
  campaignId: number,
  kind: ExportKind,
  format: ExportFormat,
) {
  const campaign = await findCampaignById(db, campaignId);
  if (!campaign) throw notFound('Campaign');
  await appendAudit(db, {
    actorId: person.id,
    action: 'export.downloaded',
    entityType: 'campaign',
    entityId: campaignId,
    after: { kind, format },
  });
  const head = { id: campaign.id, name: campaign.name };
  const [columns, rows] =
    kind === 'follow-up'
      ? [FOLLOW_UP_COLUMNS, followUpRows(db, campaignId)]
      : [CONSENSUS_COLUMNS, consensusRows(db, campaignId)];
  return {
    contentType: CONTENT_TYPES[format],
    fileName: `dipdeck-campaign-${campaignId}-${kind}.${EXTENSIONS[format]}`,
    pieces: pieces(format, kind, columns, rows, head),
  };
}
