// Placeholder while the screen is being built.
export function ObservatoriesPage() {
  return <p className="text-muted">Coming soon.</p>;
}
