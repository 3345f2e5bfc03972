import { EmptyState } from '@/components/empty-state';
import { PageHeader } from '@/components/page-header';

export function LabPage() {
  return (
    <div className="flex flex-col gap-8">
      <PageHeader
        eyebrow="Lab"
        title="Campaigns"
        description="Run searches over your targets: upload light curves, cut snippets for the Deck, and promote the dips volunteers find to candidates."
      />
      <EmptyState
        title="No campaigns yet"
        upcoming={[
          'Your campaigns, each draft, live, paused or closed',
          'Targets and the light curves uploaded for them',
          'Candidates and the follow-up list with transit windows',
        ]}
      >
        <p>
          Campaigns you set up will be listed here. Creating them and uploading light curves arrives in the
          next release of the Lab.
        </p>
      </EmptyState>
    </div>
  );
}
