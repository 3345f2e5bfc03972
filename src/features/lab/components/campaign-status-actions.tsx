import { useEffect, useId, useRef, useState } from 'react';
import { Button } from '@/components/button';
import { isApiError } from '@/lib/api-client';
import { useUpdateCampaign } from '../api/update-campaign';
import { type Campaign, campaignStatusLabels, type StatusMove, statusMoves } from '../lib/campaigns';

export type Outcome = { tone: 'success' | 'danger'; text: string };

interface CampaignStatusActionsProps {
  campaign: Campaign;
  onOutcome: (outcome: Outcome) => void;
}

const movedText: Record<string, (name: string) => string> = {
  live: (name) => `${name} is live: its open snippets go to volunteers on the Deck.`,
  paused: (name) => `${name} is paused: the Deck no longer shows its snippets.`,
  closed: (name) => `${name} is closed. Its record is final.`,
};

/** The status moves the server allows from here; closing, which cannot be undone, asks first. */
export function CampaignStatusActions({ campaign, onOutcome }: CampaignStatusActionsProps) {
  const update = useUpdateCampaign();
  const [confirming, setConfirming] = useState<StatusMove | null>(null);
  const moves = statusMoves(campaign.status);

  function move(to: StatusMove) {
    update.mutate(
      { id: campaign.id, changes: { status: to.to } },
      {
        onSuccess: (updated) => {
          setConfirming(null);
          onOutcome({
            tone: 'success',
            text: movedText[updated.status]?.(updated.name) ?? 'Status changed.',
          });
        },
        onError: (error) => {
          setConfirming(null);
          const reason = isApiError(error) ? (error.fields.status ?? error.message) : 'something went wrong.';
          onOutcome({
            tone: 'danger',
            text: `Could not make ${campaign.name} ${campaignStatusLabels[to.to].toLowerCase()}: ${reason}`,
          });
        },
      },
    );
  }

  if (moves.length === 0) {
    return (
      <p className="max-w-xs text-sm text-muted">Closed campaigns keep their record and cannot change.</p>
    );
  }

  return (
    <div className="flex flex-col gap-3 md:items-end">
      <div className="flex flex-wrap gap-3">
        {moves.map((option) => (
          <Button
            key={option.to}
            variant={option.to === 'closed' ? 'danger' : option.to === 'live' ? 'primary' : 'secondary'}
            busy={update.isPending && update.variables?.changes.status === option.to}
            disabled={update.isPending}
            aria-expanded={option.confirm ? confirming?.to === option.to : undefined}
            title={option.explanation}
            onClick={() => (option.confirm ? setConfirming(option) : move(option))}
          >
            {option.label}
          </Button>
        ))}
      </div>
      {confirming ? (
        <ConfirmMove
          campaignName={campaign.name}
          move={confirming}
          busy={update.isPending}
          onConfirm={() => move(confirming)}
          onCancel={() => setConfirming(null)}
        />
      ) : null}
    </div>
  );
}

interface ConfirmMoveProps {
  campaignName: string;
  move: StatusMove;
  busy: boolean;
  onConfirm: () => void;
  onCancel: () => void;
}

function ConfirmMove({ campaignName, move, busy, onConfirm, onCancel }: ConfirmMoveProps) {
  const headingId = useId();
  const cancelRef = useRef<HTMLButtonElement>(null);

  // The safe choice gets the focus, so a stray Enter does not close the campaign.
  useEffect(() => {
    cancelRef.current?.focus();
  }, []);

  return (
    <section
      role="alertdialog"
      aria-labelledby={headingId}
      className="flex max-w-md flex-col gap-3 rounded-lg border-l-4 border-danger bg-danger-wash p-4 text-left"
      onKeyDown={(event) => {
        if (event.key === 'Escape') onCancel();
      }}
    >
      <h2 id={headingId} className="font-semibold text-danger">
        Close {campaignName} for good?
      </h2>
      <p className="text-sm text-ink">{move.explanation}</p>
      <div className="flex flex-wrap gap-3">
        <Button variant="danger" busy={busy} onClick={onConfirm}>
          Close for good
        </Button>
        <button
          ref={cancelRef}
          type="button"
          onClick={onCancel}
          className="inline-flex min-h-target min-w-target items-center justify-center rounded-md border border-edge bg-surface px-4 font-medium text-ink hover:border-ink"
        >
          Keep it
        </button>
      </div>
    </section>
  );
}
