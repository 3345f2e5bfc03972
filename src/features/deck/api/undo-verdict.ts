import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';

/** Takes a verdict back (within 15 s, while its snippet is open). Sent through the Deck's outbox. */
export function undoVerdict(clientId: string): Promise<void> {
  return api.delete(apiPaths.verdict(clientId));
}
