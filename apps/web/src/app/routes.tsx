import { type RouteObject } from 'react-router-dom';
import { AppLayout } from '../components/layouts/app-layout';
import { RouteError } from '../components/errors/route-error';
import { paths } from '../config/paths';
import { HomeRoute } from '../features/home/routes/home';
import { SignInRoute } from '../features/auth/routes/sign-in';
import { RegisterRoute } from '../features/auth/routes/register';
import { DesignStudioRoute } from '../features/designs/routes/design-studio';
import { DesignsRoute } from '../features/designs/routes/designs';
import { JobDetailRoute } from '../features/jobs/routes/job-detail';
import { JobsBoardRoute } from '../features/jobs/routes/jobs-board';
import { SafetyRoute } from '../features/safety/routes/safety';
import { ApprovalsRoute } from '../features/approvals/routes/approvals';
import { AuditTrailRoute } from '../features/audit/routes/audit-trail';
import { MachineProfileRoute } from '../features/machine-profiles/routes/machine-profile';
import { MachineProfilesRoute } from '../features/machine-profiles/routes/machine-profiles';
import { MaterialsRoute } from '../features/materials/routes/materials';
import { PeopleRoute } from '../features/users/routes/people';
import { ReleaseDeskRoute } from '../features/release-desk/routes/release-desk';
import { RequireAuth } from '../lib/auth';
import { RequireRole } from '../lib/authorization';
import { NotFoundRoute } from './routes/not-found';

/**
 * Every page of the app. Pages below "/" need a signed-in user; People, Approvals and the audit trail need a
 * supervisor; Materials and Machine profiles a fabricator (or supervisor).
 */
export const routes: RouteObject[] = [
  {
    errorElement: <RouteError />,
    children: [
      { path: paths.signIn.path, element: <SignInRoute /> },
      { path: paths.register.path, element: <RegisterRoute /> },
      {
        path: paths.home.path,
        element: (
          <RequireAuth>
            <AppLayout />
          </RequireAuth>
        ),
        children: [
          { index: true, element: <HomeRoute />, errorElement: <RouteError embedded /> },
          { path: paths.designs.path, element: <DesignsRoute />, errorElement: <RouteError embedded /> },
          {
            path: paths.designNew.path,
            element: <DesignStudioRoute />,
            errorElement: <RouteError embedded />,
          },
          { path: paths.design.path, element: <DesignStudioRoute />, errorElement: <RouteError embedded /> },
          { path: paths.jobs.path, element: <JobsBoardRoute />, errorElement: <RouteError embedded /> },
          { path: paths.job.path, element: <JobDetailRoute />, errorElement: <RouteError embedded /> },
          { path: paths.safety.path, element: <SafetyRoute />, errorElement: <RouteError embedded /> },
          {
            path: paths.releaseDesk.path,
            errorElement: <RouteError embedded />,
            element: (
              <RequireRole allowed={['operator']}>
                <ReleaseDeskRoute />
              </RequireRole>
            ),
          },
          {
            path: paths.people.path,
            errorElement: <RouteError embedded />,
            element: (
              <RequireRole allowed={['supervisor']}>
                <PeopleRoute />
              </RequireRole>
            ),
          },
          {
            path: paths.materials.path,
            errorElement: <RouteError embedded />,
            element: (
              <RequireRole allowed={['fabricator']}>
                <MaterialsRoute />
              </RequireRole>
            ),
          },
          {
            path: paths.machineProfiles.path,
            errorElement: <RouteError embedded />,
            element: (
              <RequireRole allowed={['fabricator']}>
                <MachineProfilesRoute />
              </RequireRole>
            ),
          },
          {
            path: paths.machineProfile.path,
            errorElement: <RouteError embedded />,
            element: (
              <RequireRole allowed={['fabricator']}>
                <MachineProfileRoute />
              </RequireRole>
            ),
          },
          {
            path: paths.approvals.path,
            errorElement: <RouteError embedded />,
            element: (
              <RequireRole allowed={['supervisor']}>
                <ApprovalsRoute />
              </RequireRole>
            ),
          },
          {
            path: paths.audit.path,
            errorElement: <RouteError embedded />,
            element: (
              <RequireRole allowed={['supervisor']}>
                <AuditTrailRoute />
              </RequireRole>
            ),
          },
        ],
      },
      { path: '*', element: <NotFoundRoute /> },
    ],
  },
];
