import { describe, expect, it } from 'vitest';
import { setUpBrowserJourney } from './support/journey';

const journey = setUpBrowserJourney({
  touchSelector: 'button:visible, select:visible, nav a:visible, summary:visible',
});

// The queues of issue 3; the screen lists whatever the server reports, so this checks the two agree.
const queueNames = ['ingest', 'consensus', 'period-search', 'mail', 'housekeeping'] as const;

describe('Admin queues', () => {
  it('the admin opens Admin, then Queues, and sees the backend and the counts of every queue', async () => {
    await journey.signIn('admin@demo.dipdeck.test');
    await journey.page
      .getByRole('navigation', { name: 'Main' })
      .getByRole('link', { name: 'Admin', exact: true })
      .click();
    await journey.page.getByRole('heading', { name: 'People and roles' }).waitFor();

    const sections = journey.page.getByRole('navigation', { name: 'Admin sections' });
    await sections.getByRole('link', { name: 'Queues', exact: true }).click();
    await journey.page.getByRole('heading', { level: 1, name: 'Queues and jobs' }).waitFor();
    expect(new URL(journey.page.url()).pathname).toBe('/admin/queues');
    expect(await sections.getByRole('link', { name: 'Queues' }).getAttribute('aria-current')).toBe('page');

    const backend = journey.page.getByRole('region', { name: /Jobs run/ });
    await backend.waitFor();
    expect(await backend.textContent()).toMatch(
      /inside the server process|separate workers, queued in Redis/,
    );

    const counts = journey.page.getByRole('table', { name: 'Jobs in each queue, by state' });
    await counts.waitFor();
    for (const name of queueNames) {
      expect(await counts.getByRole('row').filter({ hasText: name }).count(), `row of ${name}`).toBe(1);
    }

    // A fresh server may or may not have failed jobs by now; either way the section must have settled.
    await journey.page
      .getByRole('heading', { name: /^No failed jobs/ })
      .or(journey.page.getByRole('table', { name: 'Latest failed jobs, newest first' }))
      .waitFor();
    await journey.screenshots('admin-queues');
  });

  it('a volunteer who goes to /admin/queues is told Admin is not for their role', async () => {
    await journey.signIn('volunteer@demo.dipdeck.test');
    const asked: string[] = [];
    journey.page.on('request', (request) => {
      if (request.url().includes('/api/admin/')) asked.push(request.url());
    });
    await journey.page.goto(journey.url('/admin/queues'));
    await journey.page.getByRole('heading', { name: 'Admin is not for your role' }).waitFor();
    expect(await journey.page.getByRole('navigation', { name: 'Admin sections' }).count()).toBe(0);
    expect(asked, 'the guard asks the API for nothing of Admin').toEqual([]);
  });
});
