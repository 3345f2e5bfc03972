import type { TransitWindow, WindowObservatory } from '../../api/get-candidate-windows';

/** Observable or not, in words and a sign, so it reads without colour. */
export function ObservableMark({ observable }: { observable: boolean }) {
  return observable ? (
    <span className="inline-flex items-center gap-1 font-semibold text-success">
      <span aria-hidden="true">✓</span> Observable
    </span>
  ) : (
    <span className="inline-flex items-center gap-1 font-medium text-muted">
      <span aria-hidden="true">✕</span> Not observable
    </span>
  );
}

export function observableSites(window: TransitWindow): WindowObservatory[] {
  return window.observatories.filter((site) => site.observable);
}

/** "Observable from Test site", "Observable from 2 of 3 observatories", "Not observable from any observatory". */
export function observabilitySummary(window: TransitWindow): string {
  const total = window.observatories.length;
  if (total === 0) return 'No observatory to check';
  const sites = observableSites(window);
  if (sites.length === 0)
    return total === 1
      ? `Not observable from ${window.observatories[0]!.name}`
      : 'Not observable from any observatory';
  if (sites.length === 1 && total === 1) return `Observable from ${sites[0]!.name}`;
  return `Observable from ${sites.map((site) => site.name).join(', ')} (${sites.length} of ${total})`;
}
