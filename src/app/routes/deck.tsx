import { Alert } from '@/components/alert';
import { Loading } from '@/components/loading';
import { useMe } from '@/features/auth/api/get-me';
import { DeckPage } from '@/features/deck/components/deck-page';

/**
 * The Deck is open to visitors too (they may judge a few cards before signing up), so it has no
 * RequireArea guard; the server decides what each judge may do.
 */
export function DeckRoute() {
  const me = useMe();
  if (me.isPending) return <Loading label="Getting the Deck ready…" />;
  if (me.isError) {
    return (
      <Alert tone="danger" title="Could not check your account">
        {me.error.message}
      </Alert>
    );
  }
  // A new key per person: nobody's cards, outbox or session count carry over to the next account.
  return <DeckPage key={me.data?.id ?? 'visitor'} person={me.data ?? null} />;
}
