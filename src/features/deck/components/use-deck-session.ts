import { useQueryClient } from '@tanstack/react-query';
import { useCallback, useEffect, useRef, useState } from 'react';
import { isApiError } from '@/lib/api-client';
import type { Person } from '@/lib/person';
import { queryKeys } from '@/lib/query-keys';
import { createVerdict } from '../api/create-verdict';
import { nextCardsQueryOptions } from '../api/get-next-cards';
import { undoVerdict } from '../api/undo-verdict';
import { formatHours } from '../lib/card-summary';
import {
  type Answer,
  answerLabels,
  type Card,
  type DeckReason,
  markTimeDays,
  type Reveal,
} from '../lib/cards';
import { appendCards, cardsToRequest, excludeList } from '../lib/deck-queue';
import { classifySendError, createOutbox, type Outbox, type OutboxEvent } from '../lib/outbox';
import { canUndo, type UndoableVerdict } from '../lib/undo-window';

/** A visitor may judge this many cards before signing up (the server's GUEST_VERDICT_LIMIT). */
export const visitorVerdictLimit = 20;
const visitorCountKey = 'dipdeck.visitor-verdicts.v1';
const refetchAfterErrorMs = 4_000;

export interface LastVerdict extends UndoableVerdict {
  answer: Answer;
  markHours: number | null;
  card: Card;
  state: 'waiting' | 'sent' | 'undone' | 'dropped';
  reveal: Reveal | null;
}

export type DeckStatus = 'loading' | 'ready' | 'offline' | 'error' | DeckReason;

function browserStorage(): Storage | null {
  try {
    return typeof window === 'undefined' ? null : window.localStorage;
  } catch {
    return null;
  }
}

function readNumber(key: string): number {
  const value = Number(browserStorage()?.getItem(key) ?? 0);
  return Number.isFinite(value) ? value : 0;
}

function newClientId(): string {
  if (typeof crypto !== 'undefined' && 'randomUUID' in crypto) return crypto.randomUUID();
  return `v${Date.now().toString(36)}${Math.random().toString(36).slice(2, 12)}`;
}

const droppedMessages: Record<string, string> = {
  snippet_not_open:
    'One snippet settled before your verdict reached us, so it was not needed. Thank you all the same.',
  campaign_not_live: 'The campaign stopped taking verdicts before one of yours arrived; it was not counted.',
  client_id_taken: 'One verdict could not be stored; the card it belonged to may come round again.',
  undo_too_late:
    'Too late to take that verdict back: it had already counted. Judge the card again to change it.',
  account_suspended: 'Your account is suspended, so verdicts are not being recorded.',
};

/** The Deck's moving parts: the card queue, the outbox, undo and what to tell the person. */
export function useDeckSession(person: Person | null) {
  const queryClient = useQueryClient();
  const [cards, setCardsState] = useState<Card[]>([]);
  const cardsRef = useRef<Card[]>([]);
  const [status, setStatus] = useState<DeckStatus>('loading');
  const [judgedCount, setJudgedCount] = useState(0);
  const [last, setLast] = useState<LastVerdict | null>(null);
  const lastRef = useRef<LastVerdict | null>(null);
  const [waiting, setWaiting] = useState(0);
  const [notice, setNotice] = useState<string | null>(null);
  const [announcement, setAnnouncement] = useState('');
  const [visitorCount, setVisitorCount] = useState(() => (person ? 0 : readNumber(visitorCountKey)));
  const [visitorLimitReached, setVisitorLimitReached] = useState(false);
  const judgedRef = useRef(new Set<number>());
  const fetchingRef = useRef(false);
  const exhaustedRef = useRef(false);
  const shownAtRef = useRef(performance.now());
  const retryTimerRef = useRef<ReturnType<typeof setTimeout> | null>(null);
  const refillRef = useRef<() => void>(() => {});
  const eventRef = useRef<(event: OutboxEvent) => void>(() => {});

  const setCards = useCallback((next: Card[]) => {
    cardsRef.current = next;
    setCardsState(next);
  }, []);

  const updateLast = useCallback((next: LastVerdict | null) => {
    lastRef.current = next;
    setLast(next);
  }, []);

  const outboxRef = useRef<Outbox | null>(null);
  outboxRef.current ??= createOutbox({
    storage: browserStorage(),
    // Each account has its own outbox: a verdict is only ever sent as the person who gave it.
    storageKey: `dipdeck.outbox.v1.${person ? person.id : 'visitor'}`,
    transport: {
      sendVerdict: (entry) =>
        createVerdict({
          clientId: entry.clientId,
          snippetId: entry.snippetId,
          answer: entry.answer,
          markTime: entry.markTime,
          elapsedMs: entry.elapsedMs,
        }),
      undoVerdict: (entry) => undoVerdict(entry.clientId),
    },
    classify: classifySendError,
    onEvent: (event) => eventRef.current(event),
  });
  const outbox = outboxRef.current;

  eventRef.current = (event) => {
    if (event.type === 'changed') {
      setWaiting(event.waiting);
      return;
    }
    const current = lastRef.current;
    const isLast = current?.clientId === event.entry.clientId;
    if (event.type === 'sent') {
      if (isLast && current.state === 'waiting')
        updateLast({ ...current, state: 'sent', reveal: event.reveal });
      void queryClient.invalidateQueries({ queryKey: queryKeys.record.all() });
      return;
    }
    if (event.type === 'undone') {
      void queryClient.invalidateQueries({ queryKey: queryKeys.record.all() });
      return;
    }
    if (event.type === 'dropped') {
      if (event.code === 'guest_limit') {
        setVisitorLimitReached(true);
        setNotice(null);
      } else if (event.code === 'account_suspended') {
        setStatus('suspended');
      } else {
        setNotice(droppedMessages[event.code] ?? `One verdict could not be recorded: ${event.message}`);
      }
      if (isLast) updateLast({ ...current, state: 'dropped', settled: true });
    }
  };

  const refill = useCallback(() => {
    if (fetchingRef.current) return;
    const held = cardsRef.current;
    const count = cardsToRequest(held.length);
    if (count === 0) return;
    // The server has said there is nothing more; ask again only once the held cards run out.
    if (exhaustedRef.current && held.length > 0) return;
    fetchingRef.current = true;
    const params = {
      campaign: null,
      count,
      exclude: excludeList(
        outboxRef.current?.pendingSnippetIds() ?? [],
        held.map((card) => card.snippetId),
      ),
    };
    queryClient
      .fetchQuery(nextCardsQueryOptions(params))
      .then((answer) => {
        const next = appendCards(cardsRef.current, answer.cards, judgedRef.current);
        exhaustedRef.current = answer.cards.length === 0;
        setCards(next);
        if (next.length > 0) setStatus('ready');
        else setStatus(answer.reason ?? 'nothing_left');
        fetchingRef.current = false;
        if (answer.cards.length > 0) refillRef.current();
      })
      .catch((error: unknown) => {
        fetchingRef.current = false;
        if (cardsRef.current.length === 0) {
          setStatus(isApiError(error) && error.status === 0 ? 'offline' : 'error');
        }
        if (retryTimerRef.current) clearTimeout(retryTimerRef.current);
        retryTimerRef.current = setTimeout(() => refillRef.current(), refetchAfterErrorMs);
      });
  }, [queryClient, setCards]);
  refillRef.current = refill;

  useEffect(() => {
    outbox.start();
    refillRef.current();
    const onOnline = () => {
      outbox.retryNow();
      refillRef.current();
    };
    window.addEventListener('online', onOnline);
    return () => {
      window.removeEventListener('online', onOnline);
      outbox.stop();
      if (retryTimerRef.current) clearTimeout(retryTimerRef.current);
    };
  }, [outbox]);

  const judge = useCallback(
    (answer: Answer, markHours: number | null) => {
      const card = cardsRef.current[0];
      if (!card || visitorLimitReached) return false;
      const clientId = newClientId();
      const markTime = answer === 'dip' && markHours !== null ? markTimeDays(card, markHours) : null;
      outbox.add({
        clientId,
        snippetId: card.snippetId,
        answer,
        markTime,
        elapsedMs: Math.round(performance.now() - shownAtRef.current),
      });
      judgedRef.current.add(card.snippetId);
      setCards(cardsRef.current.slice(1));
      shownAtRef.current = performance.now();
      setJudgedCount((value) => value + 1);
      updateLast({
        clientId,
        snippetId: card.snippetId,
        givenAtMs: Date.now(),
        answer,
        markHours: answer === 'dip' ? markHours : null,
        card,
        state: 'waiting',
        reveal: null,
      });
      setNotice(null);
      setAnnouncement(
        `${answerLabels[answer]} recorded${answer === 'dip' && markHours !== null ? `, marked at ${formatHours(markHours)}` : ''}. ${
          cardsRef.current.length > 0 ? 'Next card.' : ''
        }`,
      );
      if (!person) {
        const next = readNumber(visitorCountKey) + 1;
        try {
          browserStorage()?.setItem(visitorCountKey, String(next));
        } catch {
          // Counting visitors' cards locally is a courtesy; the server holds the real limit.
        }
        setVisitorCount(next);
        if (next >= visitorVerdictLimit) setVisitorLimitReached(true);
      }
      if (cardsRef.current.length === 0) setStatus('loading');
      refillRef.current();
      return true;
    },
    [outbox, person, setCards, updateLast, visitorLimitReached],
  );

  const undo = useCallback(() => {
    const current = lastRef.current;
    if (!current || current.state === 'undone' || !canUndo(current, Date.now())) return false;
    outbox.undo(current.clientId, current.snippetId);
    judgedRef.current.delete(current.snippetId);
    // The card comes back to the top, to be judged again.
    setCards([current.card, ...cardsRef.current.filter((card) => card.snippetId !== current.snippetId)]);
    setStatus('ready');
    shownAtRef.current = performance.now();
    setJudgedCount((value) => Math.max(0, value - 1));
    updateLast({ ...current, state: 'undone', settled: true });
    setAnnouncement(`${answerLabels[current.answer]} taken back. The card is back.`);
    if (!person) {
      const next = Math.max(0, readNumber(visitorCountKey) - 1);
      try {
        browserStorage()?.setItem(visitorCountKey, String(next));
      } catch {
        // See above.
      }
      setVisitorCount(next);
      setVisitorLimitReached(false);
    }
    return true;
  }, [outbox, person, setCards, updateLast]);

  return {
    cards,
    current: cards[0] ?? null,
    status,
    judgedCount,
    last,
    waiting,
    notice,
    dismissNotice: () => setNotice(null),
    announcement,
    visitorCount,
    visitorLimitReached,
    judge,
    undo,
    retry: refill,
  };
}
