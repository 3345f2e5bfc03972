import { EmptyState } from '@/components/empty-state';
import { PageHeader } from '@/components/page-header';

export function DeckPage() {
  return (
    <div className="flex flex-col gap-8">
      <PageHeader
        eyebrow="Deck"
        title="Judge snippets"
        description="Each card is a few hours of one star’s brightness. Say whether it dips, stays flat, or you are unsure; every verdict counts towards the consensus."
      />
      <EmptyState
        sketch="dip"
        title="No snippets to judge yet"
        upcoming={[
          'One snippet at a time from the live campaigns',
          'Three answers: dip, flat or unsure',
          'A tap on the dip’s centre to mark it, if you see one',
        ]}
      >
        <p>
          The science team is preparing light curves. When their first campaign goes live, its snippets will
          wait for you here. Nothing to do until then.
        </p>
      </EmptyState>
    </div>
  );
}
