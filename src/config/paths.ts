import { env } from '@/config/env';

/** A same-origin path we are willing to send someone back to after signing in. */
export function safeRedirect(target: string | null | undefined, fallback: string): string {
  if (target?.startsWith('/') && !target.startsWith('//')) return target;
  return fallback;
}

function withRedirect(path: string, redirectTo?: string): string {
  return redirectTo ? `${path}?redirectTo=${encodeURIComponent(redirectTo)}` : path;
}

export const paths = {
  home: { path: '/', getHref: () => '/' },
  signIn: { path: '/sign-in', getHref: (redirectTo?: string) => withRedirect('/sign-in', redirectTo) },
  signUp: { path: '/sign-up', getHref: (redirectTo?: string) => withRedirect('/sign-up', redirectTo) },
  deck: { path: '/deck', getHref: () => '/deck' },
  record: { path: '/record', getHref: () => '/record' },
  desk: { path: '/desk', getHref: () => '/desk' },
  lab: { path: '/lab', getHref: () => '/lab' },
  admin: { path: '/admin', getHref: () => '/admin' },
  adminPeople: { path: '/admin/people', getHref: () => '/admin/people' },
  adminQueues: { path: '/admin/queues', getHref: () => '/admin/queues' },
} as const;

export const apiPaths = {
  csrf: () => `${env.VITE_API_BASE}/auth/csrf`,
  me: () => `${env.VITE_API_BASE}/auth/me`,
  signIn: () => `${env.VITE_API_BASE}/auth/sign-in`,
  signUp: () => `${env.VITE_API_BASE}/auth/sign-up`,
  signOut: () => `${env.VITE_API_BASE}/auth/sign-out`,
  people: () => `${env.VITE_API_BASE}/admin/people`,
  person: (id: number) => `${env.VITE_API_BASE}/admin/people/${id}`,
  queues: () => `${env.VITE_API_BASE}/admin/queues`,
  jobs: () => `${env.VITE_API_BASE}/admin/jobs`,
  // Job ids carry their queue ("mail:12"), so the id is encoded to stay one path segment whatever it holds.
  retryJob: (id: string) => `${env.VITE_API_BASE}/admin/jobs/${encodeURIComponent(id)}/retry`,
} as const;
