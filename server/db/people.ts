import type { Knex } from 'knex';
import type { Role } from '../auth/roles';
import type { Db } from './knex';
import { nowIso, toBool, toIso, toIsoOrNull } from './rows';

export interface PersonRow {
  id: number;
  email: string | null;
  displayName: string;
  role: Role;
  suspendedAt: string | null;
  suspendedReason: string | null;
  newsletterOptIn: boolean;
  creditByName: boolean;
  emailConfirmedAt: string | null;
  sessionsValidAfter: string | null;
  lastActiveAt: string | null;
  deletedAt: string | null;
  createdAt: string;
  updatedAt: string;
}

type Raw = Record<string, unknown>;

function toPerson(row: Raw): PersonRow {
  return {
    id: Number(row.id),
    email: (row.email as string | null) ?? null,
    displayName: String(row.display_name),
    role: row.role as Role,
    suspendedAt: toIsoOrNull(row.suspended_at),
    suspendedReason: (row.suspended_reason as string | null) ?? null,
    newsletterOptIn: toBool(row.newsletter_opt_in),
    creditByName: toBool(row.credit_by_name),
    emailConfirmedAt: toIsoOrNull(row.email_confirmed_at),
    sessionsValidAfter: toIsoOrNull(row.sessions_valid_after),
    lastActiveAt: toIsoOrNull(row.last_active_at),
    deletedAt: toIsoOrNull(row.deleted_at),
    createdAt: toIso(row.created_at),
    updatedAt: toIso(row.updated_at),
  };
}

export const normaliseEmail = (email: string): string => email.trim().toLowerCase();

export async function findPersonById(db: Db, id: number): Promise<PersonRow | undefined> {
  const row = await db('people').where({ id }).first();
  return row ? toPerson(row) : undefined;
}

/**
 * How long a person read for a request's sign-in check is reused. Every request of a signed-in person
 * needs their row (role, suspension, revoked sessions); under load this read was a third of the work
 * of recording a verdict. Writes made through this module forget the person at once; a write by
 * another process (a second server, the worker) shows within this time.
 */
export const PERSON_CACHE_MS = 2_000;

type PersonCache = Map<number, { person: PersonRow | undefined; readAt: number }>;
// Keyed by the database's configuration, which a transaction shares with the Knex instance it came from.
const personCaches = new WeakMap<object, PersonCache>();

function personCache(db: Db): PersonCache {
  const key = db.client.config as object;
  let cache = personCaches.get(key);
  if (!cache) {
    cache = new Map();
    personCaches.set(key, cache);
  }
  return cache;
}

function forgetPerson(db: Db, id: number): void {
  const cache = personCache(db);
  cache.delete(id);
  // Inside a transaction, also once it ends: a read on another connection may have cached the old row.
  if (db.isTransaction)
    (db as Knex.Transaction).executionPromise.finally(() => cache.delete(id)).catch(() => {});
}

/** The person, as read at most PERSON_CACHE_MS ago: for the sign-in check on every request. */
export async function findPersonForRequest(db: Db, id: number): Promise<PersonRow | undefined> {
  const cache = personCache(db);
  const cached = cache.get(id);
  if (cached && Date.now() - cached.readAt < PERSON_CACHE_MS) return cached.person;
  const person = await findPersonById(db, id);
  if (cache.size >= 50_000) cache.clear();
  cache.set(id, { person, readAt: Date.now() });
  return person;
}

export async function findPersonByEmail(
  db: Db,
  email: string,
): Promise<{ person: PersonRow; passwordHash: string | null } | undefined> {
  const row = await db('people')
    .where({ email: normaliseEmail(email) })
    .whereNull('deleted_at')
    .first();
  return row
    ? { person: toPerson(row), passwordHash: (row.password_hash as string | null) ?? null }
    : undefined;
}

export interface NewPerson {
  email: string;
  displayName: string;
  passwordHash: string;
  role?: Role;
  newsletterOptIn?: boolean;
  creditByName?: boolean;
}

/** Inserts a person; answers undefined when the e-mail is already taken (the unique index decides). */
export async function insertPerson(db: Db, person: NewPerson): Promise<PersonRow | undefined> {
  const now = nowIso();
  const optIn = person.newsletterOptIn ?? false;
  const rows = await db('people')
    .insert({
      email: normaliseEmail(person.email),
      display_name: person.displayName,
      password_hash: person.passwordHash,
      role: person.role ?? 'volunteer',
      newsletter_opt_in: optIn,
      newsletter_opt_in_at: optIn ? now : null,
      credit_by_name: person.creditByName ?? false,
      created_at: now,
      updated_at: now,
    })
    .onConflict('email')
    .ignore()
    .returning('*');
  const row = rows[0];
  return row ? toPerson(row) : undefined;
}

export async function updatePasswordHash(db: Db, id: number, passwordHash: string): Promise<void> {
  await db('people').where({ id }).update({ password_hash: passwordHash, updated_at: nowIso() });
  forgetPerson(db, id);
}

export interface PersonChanges {
  role?: Role;
  suspendedAt?: string | null;
  suspendedReason?: string | null;
  displayName?: string;
  newsletterOptIn?: boolean;
  creditByName?: boolean;
}

export async function updatePerson(
  db: Db,
  id: number,
  changes: PersonChanges,
): Promise<PersonRow | undefined> {
  const update: Raw = { updated_at: nowIso() };
  if (changes.role !== undefined) update.role = changes.role;
  if (changes.suspendedAt !== undefined) update.suspended_at = changes.suspendedAt;
  if (changes.suspendedReason !== undefined) update.suspended_reason = changes.suspendedReason;
  if (changes.displayName !== undefined) update.display_name = changes.displayName;
  if (changes.creditByName !== undefined) update.credit_by_name = changes.creditByName;
  if (changes.newsletterOptIn !== undefined) {
    update.newsletter_opt_in = changes.newsletterOptIn;
    update.newsletter_opt_in_at = changes.newsletterOptIn ? update.updated_at : null;
  }
  const rows = await db('people').where({ id }).update(update).returning('*');
  forgetPerson(db, id);
  const row = rows[0];
  return row ? toPerson(row) : undefined;
}

export async function touchLastActive(db: Db, id: number, at: string = nowIso()): Promise<void> {
  await db('people').where({ id }).update({ last_active_at: at });
  forgetPerson(db, id);
}

export interface PeopleQuery {
  search?: string | undefined;
  role?: Role | undefined;
  limit: number;
  offset: number;
}

export async function listPeople(
  db: Db,
  query: PeopleQuery,
): Promise<{ people: PersonRow[]; total: number }> {
  const base = db('people').whereNull('deleted_at');
  if (query.role) base.andWhere({ role: query.role });
  if (query.search) {
    const pattern = `%${query.search.toLowerCase().replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    base.andWhere((w) =>
      w
        .whereRaw("lower(email) like ? escape '\\'", [pattern])
        .orWhereRaw("lower(display_name) like ? escape '\\'", [pattern]),
    );
  }
  const [countRow] = await base.clone().count<{ n: number | string }[]>({ n: '*' });
  const rows = await base.clone().orderBy('id', 'asc').limit(query.limit).offset(query.offset);
  return { people: rows.map(toPerson), total: Number(countRow?.n ?? 0) };
}

export async function countPeople(db: Db): Promise<number> {
  const [row] = await db('people').count<{ n: number | string }[]>({ n: '*' });
  return Number(row?.n ?? 0);
}

/** A new password: every session begun before now ends (passport checks sessions_valid_after). */
export async function setPasswordEndingSessions(db: Db, id: number, passwordHash: string): Promise<void> {
  const now = nowIso();
  await db('people')
    .where({ id })
    .update({ password_hash: passwordHash, sessions_valid_after: now, updated_at: now });
  forgetPerson(db, id);
}

export async function markEmailConfirmed(db: Db, id: number): Promise<PersonRow | undefined> {
  const now = nowIso();
  const rows = await db('people')
    .where({ id })
    .update({ email_confirmed_at: db.raw('coalesce(email_confirmed_at, ?)', [now]), updated_at: now })
    .returning('*');
  forgetPerson(db, id);
  return rows[0] ? toPerson(rows[0]) : undefined;
}

/**
 * Deletes an account as privacy law expects: the e-mail address, name, password and consents go, every
 * session ends; the row stays so that the person's verdicts remain in the science record, anonymously.
 */
export async function anonymisePerson(db: Db, id: number): Promise<void> {
  const now = nowIso();
  await db.transaction(async (trx) => {
    await trx('people').where({ id }).update({
      email: null,
      display_name: 'Deleted account',
      password_hash: null,
      newsletter_opt_in: false,
      newsletter_opt_in_at: null,
      credit_by_name: false,
      email_confirmed_at: null,
      sessions_valid_after: now,
      deleted_at: now,
      updated_at: now,
    });
    await trx('api_tokens').where({ person_id: id }).delete();
    await trx('email_tokens').where({ person_id: id }).delete();
  });
  forgetPerson(db, id);
}
