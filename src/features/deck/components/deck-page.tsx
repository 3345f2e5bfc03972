import { useCallback, useEffect, useRef, useState } from 'react';
import { Link } from 'react-router-dom';
import { Button } from '@/components/button';
import { paths } from '@/config/paths';
import type { Person } from '@/lib/person';
import type { Answer } from '../lib/cards';
import { deckActionForKey, type KeyPress, shortcuts } from '../lib/keyboard';
import { CardDetails, DeckCard } from './deck-card';
import { DeckState, SignUpPrompt } from './deck-states';
import { Guide, guideSeen } from './guide';
import { LastVerdictPanel } from './last-verdict';
import { OutboxIndicator } from './outbox-indicator';
import { SwipeCard } from './swipe-card';
import { useDeckSession, visitorVerdictLimit } from './use-deck-session';
import { VerdictButtons } from './verdict-buttons';

function useWideScreen(): boolean {
  const query = '(min-width: 768px)';
  const [wide, setWide] = useState(() => typeof window !== 'undefined' && window.matchMedia(query).matches);
  useEffect(() => {
    const media = window.matchMedia(query);
    const onChange = () => setWide(media.matches);
    media.addEventListener('change', onChange);
    return () => media.removeEventListener('change', onChange);
  }, []);
  return wide;
}

function targetKind(target: EventTarget | null): KeyPress['target'] {
  if (!(target instanceof HTMLElement)) return 'other';
  if (target.closest('[data-time-cursor]')) return 'time-cursor';
  if (target.isContentEditable || target.closest('input, textarea, select')) return 'text-field';
  return target.closest('button') ? 'button' : 'other';
}

/** The Deck: one card at a time, judged by swipe, button or key, and sent in the background. */
export function DeckPage({ person }: { person: Person | null }) {
  const session = useDeckSession(person);
  const [showGuide, setShowGuide] = useState(() => !guideSeen());
  // The mark and the time cursor belong to one card: a new card starts unmarked with the cursor in its
  // middle from its first frame, so a quick second key press can never send the last card's mark.
  const [markState, setMarkState] = useState<{ snippetId: number; hours: number | null } | null>(null);
  const [cursorState, setCursorState] = useState<{ snippetId: number; hours: number } | null>(null);
  const hoverRef = useRef<{ snippetId: number; hours: number | null } | null>(null);
  const [flyOut, setFlyOut] = useState<{ answer: Answer; id: number; dxPx: number; dyPx: number } | null>(
    null,
  );
  const wide = useWideScreen();
  const current = session.current;
  const currentId = current?.snippetId ?? null;
  const markHours = markState && markState.snippetId === currentId ? markState.hours : null;
  const cursorHours =
    cursorState && cursorState.snippetId === currentId
      ? cursorState.hours
      : (current?.durationHours ?? 0) / 2;
  const setMarkHours = useCallback(
    (hours: number | null) => {
      if (currentId !== null) setMarkState({ snippetId: currentId, hours });
    },
    [currentId],
  );
  const setCursorHours = useCallback(
    (hours: number) => {
      if (currentId !== null) setCursorState({ snippetId: currentId, hours });
    },
    [currentId],
  );

  const give = useCallback(
    (answer: Answer, offset = { dxPx: 0, dyPx: 0 }) => {
      if (session.judge(answer, markHours)) setFlyOut({ answer, id: Date.now(), ...offset });
    },
    [session.judge, markHours],
  );

  const toggleMark = useCallback(() => {
    if (!current) return;
    const hover = hoverRef.current;
    const at =
      hover && hover.snippetId === current.snippetId && hover.hours !== null ? hover.hours : cursorHours;
    setMarkHours(
      markHours !== null && Math.abs(markHours - at) < 1e-6
        ? null
        : Math.min(current.durationHours, Math.max(0, at)),
    );
  }, [current, cursorHours, markHours, setMarkHours]);

  const cardShown = Boolean(current) && !showGuide && !session.visitorLimitReached;

  // The listener stays put and calls the handler of the latest render, so a key pressed just after
  // a new card appeared acts on that card and its mark, never on the one before.
  const onKeyDown = useRef<(event: KeyboardEvent) => void>(() => {});
  onKeyDown.current = (event) => {
    if (showGuide || event.repeat) return;
    const action = deckActionForKey({
      key: event.key,
      altKey: event.altKey,
      ctrlKey: event.ctrlKey,
      metaKey: event.metaKey,
      shiftKey: event.shiftKey,
      target: targetKind(event.target),
    });
    if (!action) return;
    if (action.type === 'undo') {
      event.preventDefault();
      session.undo();
      return;
    }
    if (!cardShown) return;
    event.preventDefault();
    if (action.type === 'verdict') give(action.answer);
    else toggleMark();
  };
  useEffect(() => {
    const listener = (event: KeyboardEvent) => onKeyDown.current(event);
    document.addEventListener('keydown', listener);
    return () => document.removeEventListener('keydown', listener);
  }, []);

  return (
    <div className="flex flex-col gap-5 md:gap-6" data-cards-ahead={Math.max(0, session.cards.length - 1)}>
      {/* A slim header: on a phone the card and its buttons must fit on the first screen. */}
      <header className="flex items-center justify-between gap-3 border-b border-line pb-3 md:pb-4">
        <div className="flex flex-col">
          <p className="tabular hidden text-xs font-medium uppercase tracking-[0.14em] text-amber-ink md:block">
            Deck
          </p>
          <h1 className="text-xl font-semibold text-ink md:text-3xl">Judge snippets</h1>
        </div>
        {showGuide ? null : (
          <Button variant="secondary" className="text-sm" onClick={() => setShowGuide(true)}>
            How it works
          </Button>
        )}
      </header>
      <p aria-live="polite" className="sr-only">
        {session.announcement}
      </p>

      {!person ? (
        <p className="rounded-md border-l-4 border-amber bg-amber-wash px-4 py-3 text-sm text-ink">
          You are trying the Deck as a visitor:{' '}
          <span className="tabular font-medium">
            {Math.min(session.visitorCount, visitorVerdictLimit)} of {visitorVerdictLimit}
          </span>{' '}
          cards.{' '}
          <Link
            className="font-medium underline underline-offset-2"
            to={paths.signUp.getHref(paths.deck.getHref())}
          >
            Sign up
          </Link>{' '}
          to keep going; your verdicts come with you.
        </p>
      ) : null}

      {showGuide ? (
        <Guide onDone={() => setShowGuide(false)} />
      ) : session.visitorLimitReached ? (
        <SignUpPrompt />
      ) : (
        <div className="grid gap-5 lg:grid-cols-[minmax(0,1fr)_20rem] lg:gap-8">
          <div className="flex min-w-0 flex-col gap-3">
            <div className="flex flex-wrap items-center justify-between gap-x-4 gap-y-1">
              <p className="tabular text-xs text-muted">{session.judgedCount} judged this session</p>
              <OutboxIndicator waiting={session.waiting} judged={session.judgedCount} />
            </div>
            {current ? (
              <div className="relative">
                <SwipeCard onSwipe={(answer, offset) => give(answer, offset)}>
                  <DeckCard
                    card={current}
                    position={session.judgedCount + 1}
                    markHours={markHours}
                    cursorHours={cursorHours}
                    onMark={setMarkHours}
                    onCursor={setCursorHours}
                    onHover={(hours) => {
                      hoverRef.current = { snippetId: current.snippetId, hours };
                    }}
                    plotHeight={wide ? 320 : 210}
                    showReadout={wide}
                  />
                </SwipeCard>
                {flyOut ? (
                  <div
                    key={flyOut.id}
                    aria-hidden="true"
                    data-answer={flyOut.answer}
                    onAnimationEnd={() => setFlyOut(null)}
                    className={`deck-fly pointer-events-none absolute inset-0 flex items-center justify-center rounded-lg border-2 ${
                      flyOut.answer === 'dip'
                        ? 'border-amber bg-amber-wash text-amber-ink'
                        : flyOut.answer === 'flat'
                          ? 'border-slate bg-slate-wash text-slate'
                          : 'border-edge bg-surface text-ink'
                    }`}
                    style={{ translate: `${flyOut.dxPx}px ${Math.min(0, flyOut.dyPx)}px` }}
                  >
                    <span className="text-2xl font-semibold uppercase tracking-[0.14em]">
                      {flyOut.answer}
                    </span>
                  </div>
                ) : null}
              </div>
            ) : (
              <DeckState status={session.status} onRetry={session.retry} />
            )}
            <VerdictButtons onVerdict={(answer) => give(answer)} disabled={!current} />
            <p className="text-xs text-muted">
              Tap the chart where a dip is deepest to mark it; tap again to move the mark.
            </p>
            {session.notice ? (
              <div
                role="status"
                className="flex items-start justify-between gap-3 rounded-md border-l-4 border-slate bg-slate-wash px-4 py-2 text-sm text-ink"
              >
                <p className="py-2">{session.notice}</p>
                <Button variant="quiet" className="text-sm" onClick={session.dismissNotice}>
                  OK
                </Button>
              </div>
            ) : null}
          </div>
          <aside className="flex flex-col gap-4" aria-label="About your verdicts">
            <LastVerdictPanel last={session.last} onUndo={session.undo} />
            {current ? <CardDetails card={current} /> : null}
            <section
              aria-labelledby="keys-heading"
              className="hidden rounded-lg border border-line p-4 md:block"
            >
              <h2 id="keys-heading" className="pb-2 text-sm font-semibold text-ink">
                Keyboard
              </h2>
              <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1.5 text-sm">
                {shortcuts.map((shortcut) => (
                  <div key={shortcut.keys} className="contents">
                    <dt>
                      <kbd className="tabular inline-flex min-w-7 justify-center rounded-sm border border-edge bg-surface px-1.5 text-xs text-ink">
                        {shortcut.keys}
                      </kbd>
                    </dt>
                    <dd className="text-muted">{shortcut.does}</dd>
                  </div>
                ))}
              </dl>
            </section>
          </aside>
        </div>
      )}
    </div>
  );
}
