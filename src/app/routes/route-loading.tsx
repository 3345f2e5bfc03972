import { Loading } from '@/components/loading';

/** Shown while the first page's code arrives, when someone opens a lazily loaded area directly. */
export function RouteLoading() {
  return (
    <div className="mx-auto max-w-6xl px-4 lg:px-6">
      <Loading label="Loading Dipdeck…" />
    </div>
  );
}
