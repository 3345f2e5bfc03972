import { type QueryClient, useMutation, useQueryClient } from '@tanstack/react-query';
import { apiPaths } from '@/config/paths';
import { apiRequest } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';

export async function signOut(): Promise<void> {
  await apiRequest(apiPaths.signOut(), { method: 'POST', rotatesSession: true });
}

// Set when the person signs out on purpose, so that the protected page they were on sends them home
// rather than to the sign-in form (whatever order the navigation and the cache update land in).
let signedOutOnPurposeAt = 0;

/** Records a sign-out the person chose (signing out, deleting the account), for `signedOutJustNow`. */
export function markSignedOutOnPurpose(): void {
  signedOutOnPurposeAt = Date.now();
}

/** True for a few seconds after a deliberate sign-out. Reading it changes nothing, so renders stay pure. */
export function signedOutJustNow(): boolean {
  return Date.now() - signedOutOnPurposeAt < 3_000;
}

/** Drops everything cached for the person who signed out, and records that nobody is signed in. */
export function forgetSignedInPerson(queryClient: QueryClient): void {
  queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== queryKeys.me()[0] });
  queryClient.setQueryData(queryKeys.me(), null);
}

export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    onSuccess: () => {
      markSignedOutOnPurpose();
      forgetSignedInPerson(queryClient);
    },
  });
}
