import type { ComponentType } from 'react';
import { createBrowserRouter, redirect, type LoaderFunctionArgs } from 'react-router-dom';
import { queryClient } from './query-client';
import { meQueryOptions } from '../api/me';
import { projectQueryOptions } from '../api/projects';
import { AppLayout } from './layouts/app-layout';
import { SignInPage } from '../features/auth/components/sign-in-page';
import { ProjectsPage } from '../features/projects/components/projects-page';
import { NotFound, RouteError } from './route-error';

// The first page (sign-in, the projects list and the app's frame) is in the entry chunk; every
// other section is a chunk of its own, loaded when first opened (React Router's route-level
// `lazy`). tests/unit/first-page-budget.test.ts holds the entry to its size budget.
const page =
  <K extends string>(load: () => Promise<Record<K, ComponentType>>, name: K) =>
  async () => ({
    Component: (await load())[name],
  });

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
      { path: 'admin/people', lazy: page(() => import('../features/admin/components/people-page'), 'PeoplePage'), loader: requireAdmin },
      { path: 'account', lazy: page(() => import('../features/auth/components/account-page'), 'AccountPage') },
      { path: 'projects', loader: () => redirect('/') },
      {
        path: 'wave-calculator',
        lazy: page(() => import('../features/wave-calculator/components/wave-calculator-page'), 'WaveCalculatorPage'),
      },
      // The section's former address (renamed in issue 17); the server answers it with a 301 too.
      { path: 'wave-lab', loader: ({ request }) => redirect(`/wave-calculator${new URL(request.url).search}`) },
      {
        path: 'admin/mailbox',
        lazy: page(() => import('../features/alerts/components/mailbox-page'), 'MailboxPage'),
        loader: requireAdmin,
      },
      {
        path: 'projects/:projectId',
        lazy: page(() => import('./layouts/project-layout'), 'ProjectLayout'),
        loader: async ({ params }) => {
          await queryClient.ensureQueryData(projectQueryOptions(params.projectId ?? '')).catch(() => null);
          return null;
        },
        children: [
          { index: true, lazy: page(() => import('../features/overview/components/overview-page'), 'ProjectOverviewPage') },
          { path: 'settings', lazy: page(() => import('../features/projects/components/project-settings-page'), 'ProjectSettingsPage') },
          { path: 'board', lazy: page(() => import('../features/board/components/board-page'), 'BoardPage') },
          { path: 'conditions/:siteId', lazy: page(() => import('../features/board/components/conditions-page'), 'ConditionsPage') },
          { path: 'setup', lazy: page(() => import('../features/setup/components/setup-page'), 'SetupPage') },
          { path: 'downtime', lazy: page(() => import('../features/downtime/components/downtime-page'), 'DowntimePage') },
          { path: 'alerts', lazy: page(() => import('../features/alerts/components/alerts-page'), 'AlertsPage') },
          {
            path: 'forecast-skill',
            lazy: page(() => import('../features/forecast-skill/components/forecast-skill-page'), 'ForecastSkillPage'),
          },
          { path: 'vessels', lazy: page(() => import('../features/vessels/components/vessels-page'), 'VesselsPage') },
          { path: 'vessels/:vesselId', lazy: page(() => import('../features/vessels/components/vessel-page'), 'VesselPage') },
          { path: 'sea-data', lazy: page(() => import('../features/datasets/components/datasets-page'), 'DatasetsPage') },
          { path: 'sea-data/import', lazy: page(() => import('../features/datasets/components/dataset-import-page'), 'DatasetImportPage') },
          {
            path: 'sea-data/:datasetId',
            lazy: page(() => import('../features/datasets/components/dataset-detail-page'), 'DatasetDetailPage'),
          },
        ],
      },
      { path: '*', element: <NotFound /> },
    ],
  },
]);
