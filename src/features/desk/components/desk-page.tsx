import { EmptyState } from '@/components/empty-state';
import { PageHeader } from '@/components/page-header';

export function DeskPage() {
  return (
    <div className="flex flex-col gap-8">
      <PageHeader
        eyebrow="Desk"
        title="Settle split snippets"
        description="When volunteers disagree on a snippet, it comes to the Desk for a moderator to rule on."
      />
      <EmptyState
        title="No split snippets to rule on"
        upcoming={[
          'Split snippets, with every verdict and mark volunteers gave',
          'An audit of each volunteer’s reliability',
          'The audit log of moderator rulings',
        ]}
      >
        <p>
          No campaign is live yet, so no volunteer has judged a snippet and nothing has split. Snippets that
          volunteers agree on settle by themselves and never reach the Desk.
        </p>
      </EmptyState>
    </div>
  );
}
