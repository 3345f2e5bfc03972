// Placeholder while the screen is being built.
export function FollowUpPage({ campaignId }: { campaignId: number }) {
  return <p className="text-muted">Coming soon.</p>;
}
