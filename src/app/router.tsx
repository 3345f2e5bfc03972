import { createBrowserRouter } from 'react-router-dom';
import { AppLayout } from '@/app/app-layout';
import {
  AdminIndexRoute,
  AdminPeopleRoute,
  AdminQueuesRoute,
  AdminRoute,
  DeckRoute,
  DeskRoute,
  LabApiReferenceRoute,
  LabCampaignRoute,
  LabCampaignsRoute,
  LabNewCampaignRoute,
  LabRoute,
  LabSnippetsRoute,
  LabTargetRoute,
  LabTokensRoute,
  RecordRoute,
} from '@/app/routes/areas';
import { HomeRoute } from '@/app/routes/home';
import { NotFoundRoute } from '@/app/routes/not-found';
import { RootErrorBoundary } from '@/app/routes/root-error-boundary';
import { SignInRoute } from '@/app/routes/sign-in';
import { SignUpRoute } from '@/app/routes/sign-up';
import { paths } from '@/config/paths';

export const router = createBrowserRouter([
  {
    path: paths.home.path,
    Component: AppLayout,
    ErrorBoundary: RootErrorBoundary,
    children: [
      { index: true, Component: HomeRoute },
      { path: paths.signIn.path, Component: SignInRoute },
      { path: paths.signUp.path, Component: SignUpRoute },
      { path: paths.deck.path, Component: DeckRoute },
      { path: paths.record.path, Component: RecordRoute },
      { path: paths.desk.path, Component: DeskRoute },
      {
        path: paths.lab.path,
        Component: LabRoute,
        children: [
          { index: true, Component: LabCampaignsRoute },
          { path: paths.labNewCampaign.path, Component: LabNewCampaignRoute },
          { path: paths.labCampaign.path, Component: LabCampaignRoute },
          { path: paths.labSnippets.path, Component: LabSnippetsRoute },
          { path: paths.labTarget.path, Component: LabTargetRoute },
          { path: paths.labTokens.path, Component: LabTokensRoute },
          { path: paths.labApiReference.path, Component: LabApiReferenceRoute },
        ],
      },
      {
        path: paths.admin.path,
        Component: AdminRoute,
        children: [
          { index: true, Component: AdminIndexRoute },
          { path: paths.adminPeople.path, Component: AdminPeopleRoute },
          { path: paths.adminQueues.path, Component: AdminQueuesRoute },
        ],
      },
      { path: '*', Component: NotFoundRoute },
    ],
  },
]);
