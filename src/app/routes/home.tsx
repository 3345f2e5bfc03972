import { useLocation } from 'react-router-dom';
import { z } from 'zod';
import { Alert } from '@/components/alert';
import { ButtonLink } from '@/components/button';
import { LightCurveSketch } from '@/components/light-curve-sketch';
import { paths } from '@/config/paths';
import { useMe } from '@/features/auth/api/get-me';

const steps = [
  {
    title: 'Judge a snippet',
    body: 'You see a few hours of one star’s brightness. Is there a dip, is it flat, or are you unsure? If you see a dip, tap its centre.',
  },
  {
    title: 'Reach a consensus',
    body: 'Several volunteers judge every snippet. Their verdicts are weighed by how reliable each volunteer has been, so careful answers count for more.',
  },
  {
    title: 'From dip to planet candidate',
    body: 'Scientists study the dips volunteers agree on, promote the best to candidates and predict when to point a telescope at them next.',
  },
];

const noticeStateSchema = z.object({ notice: z.string() });

/** Navigation state that shows a one-line notice above the home page (after deleting an account, say). */
export function homeNotice(notice: string): z.infer<typeof noticeStateSchema> {
  return { notice };
}

export function HomeRoute() {
  const me = useMe();
  const signedIn = Boolean(me.data);
  const location = useLocation();
  // History state survives reloads and can hold anything another page put there: read it defensively.
  const notice = noticeStateSchema.safeParse(location.state).data?.notice;

  return (
    <div className="flex flex-col gap-16 md:gap-24">
      {notice ? (
        <div className="-mb-8 md:-mb-16">
          <Alert tone="success">{notice}</Alert>
        </div>
      ) : null}
      <section className="grid items-center gap-10 lg:grid-cols-[minmax(0,1.05fr)_minmax(0,1fr)] lg:gap-14">
        <div className="flex flex-col gap-6">
          <p className="tabular text-xs font-medium uppercase tracking-[0.16em] text-amber-ink">
            Citizen science · transiting planets
          </p>
          <h1 className="text-3xl font-semibold text-ink md:text-4xl">
            Help a science team find planets crossing their stars.
          </h1>
          <p className="max-w-xl text-lg text-muted">
            When a planet passes in front of its star, the starlight dips for a few hours. On Dipdeck you
            judge short snippets of light curves, the brightness of a star over time, and say whether you see
            that dip. It takes seconds, no training in astronomy is needed, and every verdict counts.
          </p>
          <div className="flex flex-wrap gap-3">
            {signedIn ? (
              <>
                <ButtonLink to={paths.deck.getHref()}>Open the Deck</ButtonLink>
                <ButtonLink variant="secondary" to={paths.record.getHref()}>
                  My record
                </ButtonLink>
              </>
            ) : (
              <>
                <ButtonLink to={paths.deck.getHref()}>Try the Deck</ButtonLink>
                <ButtonLink variant="secondary" to={paths.signUp.getHref()}>
                  Create an account
                </ButtonLink>
              </>
            )}
          </div>
        </div>

        <figure className="flex flex-col gap-3">
          <div className="rounded-lg border border-line bg-surface p-4 shadow-[0_1px_0_var(--color-line),0_24px_48px_-32px_rgb(29_35_48/0.45)] md:p-6">
            <div className="flex items-baseline justify-between gap-4 pb-3">
              <span className="tabular text-xs text-muted">snippet · 6.0 h window</span>
              <span className="tabular text-xs text-amber-ink">depth ≈ 1 900 ppm</span>
            </div>
            <LightCurveSketch seed={11} className="h-auto w-full" />
            <div aria-hidden="true" className="grid grid-cols-3 gap-2 pt-4">
              <span className="flex min-h-target items-center justify-center rounded-md bg-amber-wash font-medium text-amber-ink">
                Dip
              </span>
              <span className="flex min-h-target items-center justify-center rounded-md bg-slate-wash font-medium text-slate">
                Flat
              </span>
              <span className="flex min-h-target items-center justify-center rounded-md border border-line font-medium text-muted">
                Unsure
              </span>
            </div>
          </div>
          <figcaption className="text-sm text-muted">
            An invented snippet. Dots are brightness measurements; the amber dip in the middle is the shape a
            planet makes as it crosses its star, and the dashed line is a volunteer’s mark.
          </figcaption>
        </figure>
      </section>

      <section aria-labelledby="how-heading" className="flex flex-col gap-8">
        <h2 id="how-heading" className="text-2xl font-semibold">
          How your verdicts become discoveries
        </h2>
        <ol className="grid gap-4 md:grid-cols-3 md:gap-6">
          {steps.map((step, index) => (
            <li
              key={step.title}
              className="flex flex-col gap-3 rounded-lg border border-line bg-surface p-5 md:p-6"
            >
              <span className="tabular text-sm font-medium text-amber-ink">
                {String(index + 1).padStart(2, '0')}
              </span>
              <h3 className="text-lg font-semibold">{step.title}</h3>
              <p className="text-base text-muted">{step.body}</p>
            </li>
          ))}
        </ol>
      </section>

      {signedIn ? null : (
        <section className="flex flex-col items-start gap-5 rounded-lg bg-ink px-6 py-8 text-paper md:flex-row md:items-center md:justify-between md:px-10">
          <div className="flex flex-col gap-1.5">
            <h2 className="text-xl font-semibold">Ready for your first snippet?</h2>
            <p className="text-paper/90">
              Try twenty cards without an account. Sign up whenever you like: your verdicts come with you, and
              you choose whether we ever e-mail you.
            </p>
          </div>
          <div className="flex flex-wrap gap-3">
            <ButtonLink to={paths.deck.getHref()} variant="secondary">
              Open the Deck
            </ButtonLink>
            <ButtonLink to={paths.signUp.getHref()} variant="quiet" className="text-paper hover:text-ink">
              Create an account
            </ButtonLink>
          </div>
        </section>
      )}
    </div>
  );
}
