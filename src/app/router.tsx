import { createBrowserRouter } from 'react-router-dom';
import { AppLayout } from '@/app/app-layout';
import { DeckRoute } from '@/app/routes/deck';
import { HomeRoute } from '@/app/routes/home';
import { NotFoundRoute } from '@/app/routes/not-found';
import { RootErrorBoundary } from '@/app/routes/root-error-boundary';
import { RouteLoading } from '@/app/routes/route-loading';
import { SignInRoute } from '@/app/routes/sign-in';
import { SignUpRoute } from '@/app/routes/sign-up';
import { paths } from '@/config/paths';

// The Deck is where most people spend their time, mostly on phones, so it ships in the entry chunk;
// the staff areas (Desk, Lab, Admin) and My record load on first visit, each in a chunk of its own.
const lab = () => import('@/app/routes/lab');
const admin = () => import('@/app/routes/admin');
const desk = () => import('@/app/routes/desk');
// Pages reached from links in mail (reset a password, confirm an address): rare, so kept out of the entry.
const accountLinks = () => import('@/app/routes/account-links');

export const router = createBrowserRouter([
  {
    path: paths.home.path,
    Component: AppLayout,
    ErrorBoundary: RootErrorBoundary,
    HydrateFallback: RouteLoading,
    children: [
      { index: true, Component: HomeRoute },
      { path: paths.signIn.path, Component: SignInRoute },
      { path: paths.signUp.path, Component: SignUpRoute },
      {
        path: paths.passwordReset.path,
        lazy: () => accountLinks().then((module) => ({ Component: module.PasswordResetRoute })),
      },
      {
        path: paths.passwordResetConfirm.path,
        lazy: () => accountLinks().then((module) => ({ Component: module.PasswordResetConfirmRoute })),
      },
      {
        path: paths.confirmEmail.path,
        lazy: () => accountLinks().then((module) => ({ Component: module.ConfirmEmailRoute })),
      },
      { path: paths.deck.path, Component: DeckRoute },
      {
        path: paths.record.path,
        lazy: () => import('@/app/routes/record').then((module) => ({ Component: module.RecordRoute })),
      },
      {
        path: paths.desk.path,
        lazy: () => desk().then((module) => ({ Component: module.DeskRoute })),
        children: [
          { index: true, lazy: () => desk().then((module) => ({ Component: module.DeskSplitsRoute })) },
          {
            path: paths.deskSplit.path,
            lazy: () => desk().then((module) => ({ Component: module.DeskSplitRoute })),
          },
          {
            path: paths.deskVolunteers.path,
            lazy: () => desk().then((module) => ({ Component: module.DeskVolunteersRoute })),
          },
          {
            path: paths.deskAudit.path,
            lazy: () => desk().then((module) => ({ Component: module.DeskAuditRoute })),
          },
        ],
      },
      {
        path: paths.lab.path,
        lazy: () => lab().then((module) => ({ Component: module.LabRoute })),
        children: [
          { index: true, lazy: () => lab().then((module) => ({ Component: module.LabCampaignsRoute })) },
          {
            path: paths.labNewCampaign.path,
            lazy: () => lab().then((module) => ({ Component: module.LabNewCampaignRoute })),
          },
          {
            path: paths.labCampaign.path,
            lazy: () => lab().then((module) => ({ Component: module.LabCampaignRoute })),
          },
          {
            path: paths.labSnippets.path,
            lazy: () => lab().then((module) => ({ Component: module.LabSnippetsRoute })),
          },
          {
            path: paths.labTarget.path,
            lazy: () => lab().then((module) => ({ Component: module.LabTargetRoute })),
          },
          {
            path: paths.labCandidateReview.path,
            lazy: () => lab().then((module) => ({ Component: module.LabCandidateReviewRoute })),
          },
          {
            path: paths.labFollowUp.path,
            lazy: () => lab().then((module) => ({ Component: module.LabFollowUpRoute })),
          },
          {
            path: paths.labCandidate.path,
            lazy: () => lab().then((module) => ({ Component: module.LabCandidateRoute })),
          },
          {
            path: paths.labObservatories.path,
            lazy: () => lab().then((module) => ({ Component: module.LabObservatoriesRoute })),
          },
          {
            path: paths.labNewsletters.path,
            lazy: () => lab().then((module) => ({ Component: module.LabNewslettersRoute })),
          },
          {
            path: paths.labNewNewsletter.path,
            lazy: () => lab().then((module) => ({ Component: module.LabNewNewsletterRoute })),
          },
          {
            path: paths.labNewsletter.path,
            lazy: () => lab().then((module) => ({ Component: module.LabNewsletterRoute })),
          },
          {
            path: paths.labTokens.path,
            lazy: () => lab().then((module) => ({ Component: module.LabTokensRoute })),
          },
          {
            path: paths.labApiReference.path,
            lazy: () => lab().then((module) => ({ Component: module.LabApiReferenceRoute })),
          },
        ],
      },
      {
        path: paths.admin.path,
        lazy: () => admin().then((module) => ({ Component: module.AdminRoute })),
        children: [
          { index: true, lazy: () => admin().then((module) => ({ Component: module.AdminIndexRoute })) },
          {
            path: paths.adminPeople.path,
            lazy: () => admin().then((module) => ({ Component: module.AdminPeopleRoute })),
          },
          {
            path: paths.adminQueues.path,
            lazy: () => admin().then((module) => ({ Component: module.AdminQueuesRoute })),
          },
          {
            path: paths.adminOutbox.path,
            lazy: () => admin().then((module) => ({ Component: module.AdminOutboxRoute })),
          },
          {
            path: paths.adminOutboxMessage.path,
            lazy: () => admin().then((module) => ({ Component: module.AdminOutboxMessageRoute })),
          },
        ],
      },
      { path: '*', Component: NotFoundRoute },
    ],
  },
]);
