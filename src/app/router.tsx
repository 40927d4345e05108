import { createBrowserRouter, redirect, type LoaderFunctionArgs } from 'react-router-dom';
import { queryClient } from './query-client';
import { meQueryOptions } from '../api/me';
import { projectQueryOptions } from '../api/projects';
import { AppLayout } from './layouts/app-layout';
import { ProjectLayout } from './layouts/project-layout';
import { SignInPage } from '../features/auth/components/sign-in-page';
import { ProjectsPage } from '../features/projects/components/projects-page';
import { ProjectOverviewPage } from '../features/projects/components/project-overview-page';
import { ProjectSettingsPage } from '../features/projects/components/project-settings-page';
import { PeoplePage } from '../features/admin/components/people-page';
import { NotFound, RouteError } from './route-error';
import { WaveLabPage } from '../features/wave-lab/components/wave-lab-page';
import { DatasetsPage } from '../features/datasets/components/datasets-page';
import { DatasetDetailPage } from '../features/datasets/components/dataset-detail-page';
import { DatasetImportPage } from '../features/datasets/components/dataset-import-page';
import { BoardPage } from '../features/board/components/board-page';
import { ConditionsPage } from '../features/board/components/conditions-page';
import { SetupPage } from '../features/setup/components/setup-page';
import { DowntimePage } from '../features/downtime/components/downtime-page';
import { AlertsPage } from '../features/alerts/components/alerts-page';
import { MailboxPage } from '../features/alerts/components/mailbox-page';

/** Signed-in pages: the loader sends anonymous visitors to the sign-in page. */
async function requireSignedIn({ request }: LoaderFunctionArgs) {
  const me = await queryClient.ensureQueryData(meQueryOptions());
  if (!me) {
    const from = new URL(request.url).pathname;
    throw redirect(`/sign-in${from !== '/' ? `?from=${encodeURIComponent(from)}` : ''}`);
  }
  return null;
}

async function requireAdmin(args: LoaderFunctionArgs) {
  await requireSignedIn(args);
  const me = await queryClient.ensureQueryData(meQueryOptions());
  if (me?.globalRole !== 'admin') throw redirect('/');
  return null;
}

export const router = createBrowserRouter([
  { path: '/sign-in', element: <SignInPage /> },
  {
    path: '/',
    element: <AppLayout />,
    loader: requireSignedIn,
    errorElement: <RouteError />,
    children: [
      { index: true, element: <ProjectsPage /> },
      { path: 'admin/people', element: <PeoplePage />, loader: requireAdmin },
      { path: 'projects', loader: () => redirect('/') },
      { path: 'wave-lab', element: <WaveLabPage /> },
      { path: 'admin/mailbox', element: <MailboxPage />, loader: requireAdmin },
      {
        path: 'projects/:projectId',
        element: <ProjectLayout />,
        loader: async ({ params }) => {
          await queryClient.ensureQueryData(projectQueryOptions(params.projectId ?? '')).catch(() => null);
          return null;
        },
        children: [
          { index: true, element: <ProjectOverviewPage /> },
          { path: 'settings', element: <ProjectSettingsPage /> },
          { path: 'board', element: <BoardPage /> },
          { path: 'conditions/:siteId', element: <ConditionsPage /> },
          { path: 'setup', element: <SetupPage /> },
          { path: 'downtime', element: <DowntimePage /> },
          { path: 'alerts', element: <AlertsPage /> },
          { path: 'sea-data', element: <DatasetsPage /> },
          { path: 'sea-data/import', element: <DatasetImportPage /> },
          { path: 'sea-data/:datasetId', element: <DatasetDetailPage /> },
        ],
      },
      { path: '*', element: <NotFound /> },
    ],
  },
]);
