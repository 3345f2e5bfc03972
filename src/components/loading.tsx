export function Loading({ label = 'Loading…' }: { label?: string }) {
  return (
    <div role="status" className="flex items-center gap-3 py-10 text-muted">
      <span
        aria-hidden="true"
        className="size-4 animate-spin rounded-full border-2 border-amber border-r-transparent"
      />
      <span className="text-sm">{label}</span>
    </div>
  );
}
