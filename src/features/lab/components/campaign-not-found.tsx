import { ButtonLink } from '@/components/button';
import { EmptyState } from '@/components/empty-state';
import { paths } from '@/config/paths';

/** A campaign page opened with a number no campaign has (an old link, a typo). */
export function CampaignNotFound({ campaignId }: { campaignId: number }) {
  return (
    <EmptyState
      title="No such campaign"
      action={<ButtonLink to={paths.lab.getHref()}>All campaigns</ButtonLink>}
    >
      <p>There is no campaign with the number {campaignId}. The link may be old.</p>
    </EmptyState>
  );
}
