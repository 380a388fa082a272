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
import { PeopleRoute } from '../features/users/routes/people';
import { RequireAuth } from '../lib/auth';
import { RequireRole } from '../lib/authorization';
import { NotFoundRoute } from './routes/not-found';

/** Every page of the app. Pages below "/" need a signed-in user; People needs a supervisor. */
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
            path: paths.people.path,
            errorElement: <RouteError embedded />,
            element: (
              <RequireRole allowed={['supervisor']}>
                <PeopleRoute />
              </RequireRole>
            ),
          },
        ],
      },
      { path: '*', element: <NotFoundRoute /> },
    ],
  },
];
