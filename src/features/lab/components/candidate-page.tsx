// Placeholder while the screen is being built.
export function CandidatePage({ candidateId }: { candidateId: number }) {
  return <p className="text-muted">Coming soon.</p>;
}
