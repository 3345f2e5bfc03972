import { Badge } from '@/components/badge';
import { type CampaignStatus, campaignStatusLabels, campaignStatusTones } from '../lib/campaigns';

export function CampaignStatusBadge({ status }: { status: CampaignStatus }) {
  return <Badge tone={campaignStatusTones[status]}>{campaignStatusLabels[status]}</Badge>;
}
