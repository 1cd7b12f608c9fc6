import type { QueryClient } from '@tanstack/react-query';
import { createBrowserRouter, Navigate, Outlet } from 'react-router-dom';
import { prefetchMe } from '../features/auth';
import { prefetchPatient } from '../features/patients';
import { LoadingState } from '../lib/components/loading-state';
import { NotFoundRoute } from './not-found-route';
import { RequireAuth } from './require-auth';
import { access } from '../lib/page-access';
import { RouteError } from './route-error';

/**
 * The app's pages. Every page is split into its own chunk (React Router `lazy`), so the first
 * paint loads only what it needs; the sign-in page too, so a signed-in page never loads the
 * sign-in form (and react-hook-form with it). Loaders start the first reads (the session, the
 * Arch's patient) as the navigation starts, side by side with each other and with the page's chunk
 * (a route's own loader runs beside its `lazy`), instead of one after the other as the components
 * mount; they wait for nothing, and the pages read the same queries.
 */
export const createRouter = (queryClient: QueryClient) =>
  createBrowserRouter([
    {
      element: <Outlet />,
      errorElement: <RouteError />,
      hydrateFallbackElement: <LoadingState label="Loading Torquetrail" />,
      children: [
        {
          path: '/sign-in',
          lazy: async () => ({ Component: (await import('../features/auth/routes/sign-in-route')).SignInRoute }),
        },
        {
          path: '/welcome',
          lazy: async () => ({ Component: (await import('../features/auth/routes/welcome-route')).WelcomeRoute }),
        },
        {
          path: '/forgot-password',
          lazy: async () => ({
            Component: (await import('../features/auth/routes/forgot-password-route')).ForgotPasswordRoute,
          }),
        },
        {
          path: '/reset-password',
          lazy: async () => ({
            Component: (await import('../features/auth/routes/reset-password-route')).ResetPasswordRoute,
          }),
        },
        {
          path: '/',
          element: <RequireAuth />,
          loader: () => {
            prefetchMe(queryClient);
            return null;
          },
          children: [
            { index: true, element: <Navigate to="/patients" replace /> },
            {
              path: 'patients',
              handle: access('patients'),
              lazy: async () => ({
                Component: (await import('../features/patients/routes/patients-route')).PatientsRoute,
              }),
            },
            {
              path: 'patients/new',
              handle: access('patients/new'),
              lazy: async () => ({
                Component: (await import('../features/patients/routes/new-patient-route')).NewPatientRoute,
              }),
            },
            {
              path: 'patients/:patientId/edit',
              handle: access('patients/:patientId/edit'),
              lazy: async () => ({
                Component: (await import('../features/patients/routes/edit-patient-route')).EditPatientRoute,
              }),
            },
            {
              path: 'patients/:patientId',
              handle: access('patients/:patientId'),
              loader: ({ params }) => {
                if (params.patientId) prefetchPatient(queryClient, params.patientId);
                return null;
              },
              lazy: async () => ({ Component: (await import('../features/arch/routes/arch-route')).ArchRoute }),
            },
            {
              path: 'patients/:patientId/sites/:siteId',
              handle: access('patients/:patientId/sites/:siteId'),
              lazy: async () => ({
                Component: (await import('../features/site-file/routes/site-file-route')).SiteFileRoute,
              }),
            },
            {
              path: 'patients/:patientId/sites/:siteId/placement',
              handle: access('patients/:patientId/sites/:siteId/placement'),
              lazy: async () => ({
                Component: (await import('../features/placement/routes/record-placement-route')).RecordPlacementRoute,
              }),
            },
            {
              path: 'patients/:patientId/restorations',
              handle: access('patients/:patientId/restorations'),
              lazy: async () => ({
                Component: (await import('../features/planner/routes/restorations-route')).RestorationsRoute,
              }),
            },
            {
              path: 'patients/:patientId/restorations/new',
              handle: access('patients/:patientId/restorations/new'),
              lazy: async () => ({
                Component: (await import('../features/planner/routes/planner-route')).PlannerRoute,
              }),
            },
            {
              path: 'patients/:patientId/radiographs',
              handle: access('patients/:patientId/radiographs'),
              lazy: async () => ({
                Component: (await import('../features/radiographs/routes/radiographs-route')).RadiographsRoute,
              }),
            },
            {
              path: 'patients/:patientId/radiographs/:radiographId',
              handle: access('patients/:patientId/radiographs/:radiographId'),
              lazy: async () => ({
                Component: (await import('../features/radiographs/routes/radiograph-viewer-route'))
                  .RadiographViewerRoute,
              }),
            },
            {
              path: 'outcomes',
              handle: access('outcomes'),
              lazy: async () => ({
                Component: (await import('../features/outcomes/routes/outcomes-route')).OutcomesRoute,
              }),
            },
            {
              path: 'lot-lookup',
              handle: access('lot-lookup'),
              lazy: async () => ({
                Component: (await import('../features/outcomes/routes/lot-lookup-route')).LotLookupRoute,
              }),
            },
            {
              path: 'catalogue',
              handle: access('catalogue'),
              lazy: async () => ({
                Component: (await import('../features/catalogue/routes/catalogue-route')).CatalogueRoute,
              }),
            },
            {
              path: 'recalls',
              handle: access('recalls'),
              lazy: async () => ({
                Component: (await import('../features/recalls/routes/recall-desk-route')).RecallDeskRoute,
              }),
            },
            {
              path: 'recalls/patients/:patientId/exam',
              handle: access('recalls/patients/:patientId/exam'),
              lazy: async () => ({ Component: (await import('../features/recalls/routes/exam-route')).ExamRoute }),
            },
            {
              path: 'recalls/policy',
              handle: access('recalls/policy'),
              lazy: async () => ({ Component: (await import('../features/recalls/routes/policy-route')).PolicyRoute }),
            },
            {
              path: 'recalls/reminders',
              handle: access('recalls/reminders'),
              lazy: async () => ({
                Component: (await import('../features/recalls/routes/reminder-log-route')).ReminderLogRoute,
              }),
            },
            {
              path: 'account',
              handle: access('account'),
              lazy: async () => ({ Component: (await import('../features/auth/routes/account-route')).AccountRoute }),
            },
            {
              path: 'import-records',
              handle: access('import-records'),
              lazy: async () => ({ Component: (await import('../features/imports/routes/import-route')).ImportRoute }),
            },
            {
              path: 'practice',
              handle: access('practice'),
              lazy: async () => ({
                Component: (await import('../features/people/routes/practice-route')).PracticeRoute,
              }),
              children: [
                {
                  index: true,
                  lazy: async () => ({
                    Component: (await import('../features/people/routes/practice-route')).PracticeHome,
                  }),
                },
                {
                  path: 'people',
                  handle: access('practice/people'),
                  lazy: async () => ({
                    Component: (await import('../features/people/routes/people-route')).PeopleRoute,
                  }),
                },
                {
                  path: 'sign-in',
                  handle: access('practice/sign-in'),
                  lazy: async () => ({
                    Component: (await import('../features/people/routes/sign-in-settings-route')).SignInSettingsRoute,
                  }),
                },
                {
                  path: 'contact',
                  handle: access('practice/contact'),
                  lazy: async () => ({
                    Component: (await import('../features/people/routes/practice-contact-route')).PracticeContactRoute,
                  }),
                },
                {
                  path: 'patient-settings',
                  handle: access('practice/patient-settings'),
                  lazy: async () => ({
                    Component: (await import('../features/patients/routes/patient-settings-route'))
                      .PatientSettingsRoute,
                  }),
                },
                {
                  path: 'shares',
                  handle: access('practice/shares'),
                  lazy: async () => ({
                    Component: (await import('../features/shares/routes/practice-shares-route')).PracticeSharesRoute,
                  }),
                },
                {
                  path: 'audit',
                  handle: access('practice/audit'),
                  lazy: async () => ({ Component: (await import('../features/audit/routes/audit-route')).AuditRoute }),
                },
              ],
            },
            { path: '*', element: <NotFoundRoute /> },
          ],
        },
      ],
    },
  ]);
