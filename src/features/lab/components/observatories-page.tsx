import { useEffect, useRef, useState } from 'react';
import { Alert } from '@/components/alert';
import { Button } from '@/components/button';
import { ErrorBoundary } from '@/components/error-boundary';
import { LoadFailure } from '@/components/load-failure';
import { Loading } from '@/components/loading';
import { PageHeader } from '@/components/page-header';
import { Table, TableBody, TableHead, Td, Th, Tr } from '@/components/table';
import { isApiError } from '@/lib/api-client';
import { useCreateObservatory } from '../api/create-observatory';
import { useDeleteObservatory } from '../api/delete-observatory';
import { type Observatory, type ObservatoryFields, useObservatories } from '../api/get-observatories';
import { useUpdateObservatory } from '../api/update-observatory';
import { ObservatoryForm } from './follow-up/observatory-form';

type Outcome = { tone: 'success' | 'danger'; text: string };

const degrees = (value: number, digits = 4) => `${Number(value.toFixed(digits))}°`;

/** "57.9° N, 2.9° W": the place as people say it. */
function formatPlace(observatory: Observatory): string {
  const lat = `${degrees(Math.abs(observatory.latitudeDeg))} ${observatory.latitudeDeg < 0 ? 'S' : 'N'}`;
  const lon = `${degrees(Math.abs(observatory.longitudeDeg))} ${observatory.longitudeDeg < 0 ? 'W' : 'E'}`;
  return `${lat}, ${lon}`;
}

/** Only the fields that differ, so a change never re-sends a name it did not touch. */
function changedFields(before: Observatory, after: ObservatoryFields): Partial<ObservatoryFields> {
  const changes: Partial<ObservatoryFields> = {};
  for (const key of Object.keys(after) as (keyof ObservatoryFields)[]) {
    if (after[key] !== before[key]) Object.assign(changes, { [key]: after[key] });
  }
  return changes;
}

export function ObservatoriesPage() {
  const [outcome, setOutcome] = useState<Outcome | null>(null);
  const [editing, setEditing] = useState<Observatory | null>(null);
  const formHeadingRef = useRef<HTMLHeadingElement>(null);

  // On a phone the form is below the list: take the reader to it when a change starts.
  useEffect(() => {
    if (editing) formHeadingRef.current?.focus();
  }, [editing]);

  return (
    <div className="flex flex-col gap-8">
      <PageHeader
        eyebrow="Lab"
        title="Observatories"
        description={
          <p>
            Where transit windows are planned for. A window counts as observable from a site when, for the
            whole window, the target stays above the site’s lowest altitude and the Sun below its limit.
            Targets within 30° of the Sun are never proposed.
          </p>
        }
      />
      <div aria-live="polite" className="empty:hidden">
        {outcome ? <Alert tone={outcome.tone}>{outcome.text}</Alert> : null}
      </div>
      <div className="grid grid-cols-1 gap-8 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <section aria-labelledby="observatories-heading" className="flex min-w-0 flex-col gap-4">
          <h2 id="observatories-heading" className="text-xl font-semibold text-ink">
            Sites
          </h2>
          <ErrorBoundary
            fallback={(_error, reset) => (
              <Alert tone="danger" title="The observatory list could not be shown">
                <Button variant="secondary" className="mt-2" onClick={reset}>
                  Try again
                </Button>
              </Alert>
            )}
          >
            <ObservatoryList
              editingId={editing?.id ?? null}
              onEdit={(observatory) => {
                setEditing(observatory);
                setOutcome(null);
              }}
              onOutcome={(next) => {
                setOutcome(next);
                setEditing(null);
              }}
            />
          </ErrorBoundary>
        </section>
        <section aria-labelledby="observatory-form-heading" className="flex flex-col gap-4">
          <h2
            id="observatory-form-heading"
            ref={formHeadingRef}
            tabIndex={-1}
            className="text-xl font-semibold text-ink"
          >
            {editing ? `Change ${editing.name}` : 'Add an observatory'}
          </h2>
          {editing ? (
            <EditObservatory
              key={editing.id}
              observatory={editing}
              onDone={(next) => {
                setEditing(null);
                if (next) setOutcome(next);
              }}
            />
          ) : (
            <AddObservatory onOutcome={setOutcome} />
          )}
        </section>
      </div>
    </div>
  );
}

function AddObservatory({ onOutcome }: { onOutcome: (outcome: Outcome) => void }) {
  const create = useCreateObservatory();
  // A fresh form after each success, rather than clearing every field by hand.
  const [round, setRound] = useState(0);
  return (
    <ObservatoryForm
      key={round}
      observatory={null}
      busy={create.isPending}
      error={create.error}
      onSubmit={(fields) =>
        create.mutate(fields, {
          onSuccess: (observatory) => {
            setRound((value) => value + 1);
            create.reset();
            onOutcome({
              tone: 'success',
              text: `${observatory.name} is added; transit windows now say whether it can watch them.`,
            });
          },
        })
      }
    />
  );
}

function EditObservatory({
  observatory,
  onDone,
}: {
  observatory: Observatory;
  onDone: (outcome: Outcome | null) => void;
}) {
  const update = useUpdateObservatory();
  return (
    <ObservatoryForm
      observatory={observatory}
      busy={update.isPending}
      error={update.error}
      onCancel={() => onDone(null)}
      onSubmit={(fields) => {
        const changes = changedFields(observatory, fields);
        if (Object.keys(changes).length === 0) {
          onDone({ tone: 'success', text: `Nothing changed in ${observatory.name}.` });
          return;
        }
        update.mutate(
          { id: observatory.id, changes },
          {
            onSuccess: (saved) => onDone({ tone: 'success', text: `${saved.name} is saved.` }),
          },
        );
      }}
    />
  );
}

function ObservatoryList({
  editingId,
  onEdit,
  onOutcome,
}: {
  editingId: number | null;
  onEdit: (observatory: Observatory) => void;
  onOutcome: (outcome: Outcome) => void;
}) {
  const observatories = useObservatories();
  if (observatories.isPending) return <Loading label="Loading the observatories…" />;
  if (observatories.isError) {
    return (
      <LoadFailure
        title="Could not load the observatories"
        error={observatories.error}
        onRetry={() => observatories.refetch()}
      />
    );
  }
  if (observatories.data.length === 0) {
    return (
      <p className="rounded-lg border border-dashed border-edge bg-surface px-4 py-5 text-base text-muted">
        No observatories yet. Add one, and every candidate’s transit windows say whether it can watch them.
      </p>
    );
  }
  return (
    <Table caption="Observatories">
      <TableHead>
        <Th>Observatory</Th>
        <Th>Elevation</Th>
        <Th>Lowest target altitude</Th>
        <Th>Sun limit</Th>
        <Th className="text-right">
          <span className="sr-only">Actions</span>
        </Th>
      </TableHead>
      <TableBody>
        {observatories.data.map((observatory) => (
          <ObservatoryRow
            key={observatory.id}
            observatory={observatory}
            editing={observatory.id === editingId}
            onEdit={() => onEdit(observatory)}
            onOutcome={onOutcome}
          />
        ))}
      </TableBody>
    </Table>
  );
}

function ObservatoryRow({
  observatory,
  editing,
  onEdit,
  onOutcome,
}: {
  observatory: Observatory;
  editing: boolean;
  onEdit: () => void;
  onOutcome: (outcome: Outcome) => void;
}) {
  const remove = useDeleteObservatory();
  const [confirming, setConfirming] = useState(false);

  function removeNow() {
    remove.mutate(observatory.id, {
      onSuccess: () => {
        setConfirming(false);
        onOutcome({
          tone: 'success',
          text: `${observatory.name} is removed; windows are no longer planned for it.`,
        });
      },
      onError: (error) => {
        setConfirming(false);
        onOutcome({
          tone: 'danger',
          text: `Could not remove ${observatory.name}: ${isApiError(error) ? error.message : 'something went wrong.'}`,
        });
      },
    });
  }

  return (
    <Tr selected={editing}>
      <Td label="Observatory">
        <span className="flex min-w-0 flex-col text-right md:text-left">
          <span className="font-medium text-ink">{observatory.name}</span>
          <span className="tabular text-sm text-slate">{formatPlace(observatory)}</span>
        </span>
      </Td>
      <Td label="Elevation">
        <span className="tabular text-sm text-ink">{Number(observatory.elevationM.toFixed(1))} m</span>
      </Td>
      <Td label="Lowest target altitude">
        <span className="tabular text-sm text-ink">{degrees(observatory.minTargetAltitudeDeg, 1)}</span>
      </Td>
      <Td label="Sun limit">
        <span className="tabular text-sm text-ink">{degrees(observatory.sunAltitudeLimitDeg, 1)}</span>
      </Td>
      <Td label="Actions" className="before:hidden md:text-right">
        {confirming ? (
          <span className="flex w-full flex-wrap justify-end gap-2">
            <Button
              variant="danger"
              busy={remove.isPending}
              onClick={removeNow}
              aria-label={`Remove ${observatory.name} now`}
            >
              Remove now
            </Button>
            <Button variant="secondary" onClick={() => setConfirming(false)}>
              Keep
            </Button>
          </span>
        ) : (
          <span className="flex w-full flex-wrap justify-end gap-2 md:flex-nowrap">
            <Button variant="secondary" aria-label={`Change ${observatory.name}`} onClick={onEdit}>
              Change
            </Button>
            <Button
              variant="danger"
              aria-label={`Remove ${observatory.name}`}
              onClick={() => setConfirming(true)}
            >
              Remove
            </Button>
          </span>
        )}
      </Td>
    </Tr>
  );
}
