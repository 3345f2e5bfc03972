import { Alert } from '@/components/alert';
import { Button, ButtonLink } from '@/components/button';
import { EmptyState } from '@/components/empty-state';
import { Loading } from '@/components/loading';
import { paths } from '@/config/paths';
import type { DeckStatus } from './use-deck-session';

/** What the Deck says when it has no card to show, for each reason the server or the network gives. */
export function DeckState({ status, onRetry }: { status: DeckStatus; onRetry: () => void }) {
  switch (status) {
    case 'nothing_left':
      return (
        <EmptyState
          title="You have seen every card on offer"
          sketch="flat"
          action={
            <ButtonLink variant="secondary" to={paths.record.getHref()}>
              My record
            </ButtonLink>
          }
        >
          <p>
            Every open snippet of the live campaign has your verdict, or enough verdicts already. New light
            curves arrive as the science team uploads them; come back in a while.
          </p>
        </EmptyState>
      );
    case 'no_live_campaign':
      return (
        <EmptyState title="No campaign is live right now" sketch="dip">
          <p>
            The science team is preparing their next search. When a campaign goes live, its snippets wait for
            you here.
          </p>
        </EmptyState>
      );
    case 'suspended':
      return (
        <Alert tone="danger" title="Your account is suspended">
          <p>
            While it is suspended the Deck takes no verdicts. If you think this is a mistake, write to the
            team.
          </p>
        </Alert>
      );
    case 'offline':
      return (
        <Alert tone="note" title="No connection">
          <p>
            The next cards load as soon as the connection is back. Your verdicts so far are safe on this
            device.
          </p>
          <Button variant="secondary" className="mt-2" onClick={onRetry}>
            Try again
          </Button>
        </Alert>
      );
    case 'error':
      return (
        <Alert tone="danger" title="Could not load the next cards">
          <p>The Deck keeps trying by itself every few seconds.</p>
          <Button variant="secondary" className="mt-2" onClick={onRetry}>
            Try again now
          </Button>
        </Alert>
      );
    default:
      return <Loading label="Fetching cards…" />;
  }
}

/** After a visitor's twenty cards: their verdicts are kept and come with them when they sign up. */
export function SignUpPrompt() {
  return (
    <section
      aria-labelledby="sign-up-prompt"
      className="flex flex-col gap-4 rounded-lg bg-ink px-5 py-6 text-paper md:px-8"
    >
      <h2 id="sign-up-prompt" className="text-xl font-semibold">
        Twenty cards judged: thank you!
      </h2>
      <p className="text-paper/90">
        Visitors can judge twenty cards. Create an account to keep going: the verdicts you gave come with you
        and start to count.
      </p>
      <div className="flex flex-wrap gap-3">
        <ButtonLink variant="secondary" to={paths.signUp.getHref(paths.deck.getHref())}>
          Create an account
        </ButtonLink>
        <ButtonLink
          variant="quiet"
          className="text-paper hover:text-ink"
          to={paths.signIn.getHref(paths.deck.getHref())}
        >
          Sign in
        </ButtonLink>
      </div>
    </section>
  );
}
