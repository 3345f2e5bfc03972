import { type ReactNode, useEffect, useId, useState } from 'react';
import { Alert } from '@/components/alert';
import { Badge } from '@/components/badge';
import { Button } from '@/components/button';
import { EmptyState } from '@/components/empty-state';
import { ErrorBoundary } from '@/components/error-boundary';
import { Loading } from '@/components/loading';
import { PageHeader } from '@/components/page-header';
import { Pager } from '@/components/pager';
import { Select } from '@/components/select';
import { Table, TableBody, TableHead, Td, Th, Tr } from '@/components/table';
import { inputClasses } from '@/components/text-field';
import { isApiError } from '@/lib/api-client';
import { type Person, type Role, roleLabels, roles } from '@/lib/person';
import { usePeople } from '../api/get-people';
import { useUpdatePerson } from '../api/update-person';

const pageSize = 20;
const searchDelayMs = 250;

type Outcome = { tone: 'success' | 'danger'; text: string };

export function PeopleAdmin({ currentPersonId }: { currentPersonId: number }) {
  const searchId = useId();
  const roleFilterId = useId();
  const [search, setSearch] = useState('');
  const [q, setQ] = useState('');
  const [roleFilter, setRoleFilter] = useState('');
  const [page, setPage] = useState(1);
  const [outcome, setOutcome] = useState<Outcome | null>(null);

  // Typing should not fire one request per key.
  useEffect(() => {
    const timer = window.setTimeout(() => {
      setQ(search);
      setPage(1);
    }, searchDelayMs);
    return () => window.clearTimeout(timer);
  }, [search]);

  return (
    <div className="flex flex-col gap-8">
      <PageHeader
        eyebrow="Admin"
        title="People and roles"
        description="Give people the role they need, and suspend accounts that misbehave. Changes take effect on their next request."
      />

      <div className="flex flex-col gap-4 md:flex-row md:items-end">
        <div className="flex flex-1 flex-col gap-1.5">
          <label htmlFor={searchId} className="text-sm font-medium">
            Search people
          </label>
          <input
            id={searchId}
            type="search"
            value={search}
            onChange={(event) => setSearch(event.target.value)}
            placeholder="Name or e-mail"
            className={inputClasses}
          />
        </div>
        <div className="flex flex-col gap-1.5 md:w-56">
          <label htmlFor={roleFilterId} className="text-sm font-medium">
            Show
          </label>
          <Select
            id={roleFilterId}
            value={roleFilter}
            onChange={(event) => {
              setRoleFilter(event.target.value);
              setPage(1);
            }}
          >
            <option value="">All roles</option>
            {roles.map((role) => (
              <option key={role} value={role}>
                {roleLabels[role]}s
              </option>
            ))}
          </Select>
        </div>
      </div>

      <div aria-live="polite" className="empty:hidden">
        {outcome ? <Alert tone={outcome.tone}>{outcome.text}</Alert> : null}
      </div>

      <ErrorBoundary
        fallback={(_error, reset) => (
          <Alert tone="danger" title="The people table could not be shown">
            <Button variant="secondary" className="mt-2" onClick={reset}>
              Try again
            </Button>
          </Alert>
        )}
      >
        <PeopleTable
          params={{ q, role: roleFilter, page, pageSize }}
          currentPersonId={currentPersonId}
          onPage={setPage}
          onOutcome={setOutcome}
        />
      </ErrorBoundary>
    </div>
  );
}

interface PeopleTableProps {
  params: { q: string; role: string; page: number; pageSize: number };
  currentPersonId: number;
  onPage: (page: number) => void;
  onOutcome: (outcome: Outcome) => void;
}

function PeopleTable({ params, currentPersonId, onPage, onOutcome }: PeopleTableProps) {
  const people = usePeople(params);

  if (people.isPending) return <Loading label="Loading people…" />;
  if (people.isError) {
    return (
      <Alert tone="danger" title="Could not load people">
        {isApiError(people.error) ? people.error.message : 'Something went wrong.'}
      </Alert>
    );
  }

  const { total, page } = people.data;

  if (people.data.people.length === 0) {
    return (
      <EmptyState title="Nobody matches">
        <p>No account matches that search. Try part of a name or an e-mail address.</p>
      </EmptyState>
    );
  }

  return (
    <div className="flex flex-col gap-4" aria-busy={people.isFetching || undefined}>
      <Table caption="People with a Dipdeck account">
        <TableHead>
          <Th>Person</Th>
          <Th>Role</Th>
          <Th>Status</Th>
          <Th>Joined</Th>
          <Th className="text-right">Access</Th>
        </TableHead>
        <TableBody>
          {people.data.people.map((person) => (
            <PersonRow
              key={person.id}
              person={person}
              isSelf={person.id === currentPersonId}
              onOutcome={onOutcome}
            />
          ))}
        </TableBody>
      </Table>
      <Pager noun="people" page={page} pageSize={params.pageSize} total={total} onPage={onPage} />
    </div>
  );
}

const joinedFormat = new Intl.DateTimeFormat('en-GB', { day: '2-digit', month: 'short', year: 'numeric' });

function PersonRow({
  person,
  isSelf,
  onOutcome,
}: {
  person: Person;
  isSelf: boolean;
  onOutcome: (outcome: Outcome) => void;
}) {
  const update = useUpdatePerson();
  const joined = new Date(person.createdAt);

  function change(changes: { role?: Role; suspended?: boolean }, success: string, failure: string) {
    update.mutate(
      { id: person.id, changes },
      {
        onSuccess: () => onOutcome({ tone: 'success', text: success }),
        onError: (error) =>
          onOutcome({
            tone: 'danger',
            text: `${failure}: ${isApiError(error) ? error.message : 'something went wrong.'}`,
          }),
      },
    );
  }

  return (
    <Tr>
      <Td label="Person">
        <span className="flex min-w-0 flex-col text-right md:text-left">
          <span className="font-medium text-ink">
            {person.displayName}
            {isSelf ? <span className="ml-2 text-sm font-normal text-muted">(you)</span> : null}
          </span>
          <span className="break-all text-sm text-muted">{person.email}</span>
        </span>
      </Td>
      <Td label="Role">
        <Select
          aria-label={`Role of ${person.displayName}`}
          value={person.role}
          disabled={update.isPending}
          onChange={(event) => {
            const role = event.target.value as Role;
            change(
              { role },
              `${person.displayName} is now ${article(role)} ${roleLabels[role].toLowerCase()}.`,
              `Could not change ${person.displayName}’s role`,
            );
          }}
        >
          {roles.map((role) => (
            <option key={role} value={role}>
              {roleLabels[role]}
            </option>
          ))}
        </Select>
      </Td>
      <Td label="Status">
        {person.suspended ? <Badge tone="danger">Suspended</Badge> : <Badge tone="success">Active</Badge>}
      </Td>
      <Td label="Joined">
        <span className="tabular text-sm text-slate">
          {Number.isNaN(joined.getTime()) ? person.createdAt : joinedFormat.format(joined)}
        </span>
      </Td>
      <Td label="Access" className="md:text-right">
        <SuspendButton
          suspended={person.suspended}
          name={person.displayName}
          busy={update.isPending}
          onClick={() =>
            person.suspended
              ? change(
                  { suspended: false },
                  `${person.displayName} can sign in again.`,
                  `Could not restore ${person.displayName}`,
                )
              : change(
                  { suspended: true },
                  `${person.displayName} is suspended and cannot sign in.`,
                  `Could not suspend ${person.displayName}`,
                )
          }
        />
      </Td>
    </Tr>
  );
}

function SuspendButton(props: {
  suspended: boolean;
  name: string;
  busy: boolean;
  onClick: () => void;
}): ReactNode {
  const verb = props.suspended ? 'Restore' : 'Suspend';
  return (
    <Button
      variant={props.suspended ? 'secondary' : 'danger'}
      aria-label={`${verb} ${props.name}`}
      disabled={props.busy}
      onClick={props.onClick}
      className="w-28"
    >
      {verb}
    </Button>
  );
}

function article(role: Role): string {
  return role === 'admin' ? 'an' : 'a';
}
