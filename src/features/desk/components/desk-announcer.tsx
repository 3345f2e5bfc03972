import { createContext, type ReactNode, useCallback, useContext, useEffect, useMemo, useState } from 'react';
import { useLocation } from 'react-router-dom';

interface Announcement {
  text: string;
  tone: 'success' | 'note';
}

const AnnounceContext = createContext<(text: string, tone?: Announcement['tone']) => void>(() => {});

/** Says what the Desk just did, such as "Ruled dip on DPD-0417-3021", in a live region. */
export function useAnnounce() {
  return useContext(AnnounceContext);
}

/**
 * Holds the Desk's live region above its pages, so a ruling is still announced after the review has
 * moved on to the next split (a region that appears together with its text is not read out).
 */
export function DeskAnnouncer({ children }: { children: ReactNode }) {
  const [announcement, setAnnouncement] = useState<Announcement | null>(null);
  const { pathname } = useLocation();
  const inSplits = pathname === '/desk' || pathname.startsWith('/desk/splits');

  // What was said about rulings does not belong on the volunteer audit or the audit log.
  useEffect(() => {
    if (!inSplits) setAnnouncement(null);
  }, [inSplits]);

  const announce = useCallback((text: string, tone: Announcement['tone'] = 'success') => {
    setAnnouncement({ text, tone });
  }, []);
  const value = useMemo(() => announce, [announce]);

  return (
    <AnnounceContext.Provider value={value}>
      <div
        aria-live="polite"
        data-desk-announcement
        className={
          announcement
            ? `rounded-md border-l-4 px-4 py-3 text-sm font-medium ${
                announcement.tone === 'success'
                  ? 'border-success bg-success-wash text-success'
                  : 'border-amber bg-amber-wash text-ink'
              }`
            : 'sr-only'
        }
      >
        {announcement?.text ?? ''}
      </div>
      {children}
    </AnnounceContext.Provider>
  );
}
