/** How many verdicts are still on this device, waiting for the server to acknowledge them. */
export function OutboxIndicator({ waiting, judged }: { waiting: number; judged: number }) {
  return (
    <p
      role="status"
      data-testid="outbox-indicator"
      className="tabular flex min-h-6 items-center gap-2 text-xs"
    >
      {waiting > 0 ? (
        <>
          <span aria-hidden="true" className="size-2 animate-pulse rounded-full bg-amber" />
          <span className="text-amber-ink">
            {waiting} {waiting === 1 ? 'verdict' : 'verdicts'} waiting to send
          </span>
        </>
      ) : judged > 0 ? (
        <>
          <span aria-hidden="true" className="size-2 rounded-full bg-success" />
          <span className="text-success">all verdicts sent</span>
        </>
      ) : null}
    </p>
  );
}
