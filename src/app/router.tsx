import type { ComponentType } from 'react';
import { createBrowserRouter, RouterProvider } from 'react-router-dom';
import { LoadingPanel } from '../components/ui/status-panel';
import { paths } from '../config/paths';
import { PlainPage } from './layout/plain-page';
import { RouteErrorScreen } from './routes/route-error';

/**
 * Loads a screen on demand. If its file cannot be fetched (network drop, or a new release
 * replaced it), React Router keeps treating the route as "still loading" and renders a blank
 * page; handing it a component that throws the failure lets the route's error screen show.
 */
function screen<TModule>(load: () => Promise<TModule>, pick: (module: TModule) => ComponentType) {
  return async () => {
    try {
      return { Component: pick(await load()) };
    } catch (error) {
      return {
        Component: function ScreenFailedToLoad(): never {
          throw error;
        },
      };
    }
  };
}

/*
 * Every screen is loaded on demand, so the sign-in page downloads only what it needs; the
 * table, the people forms and later the step clock arrive when a signed-in person opens them.
 */
export const router = createBrowserRouter([
  {
    id: 'root',
    errorElement: <RouteErrorScreen framed />,
    hydrateFallbackElement: (
      <PlainPage>
        <LoadingPanel label="Starting Luxtempo…" />
      </PlainPage>
    ),
    children: [
      {
        path: paths.signIn.path,
        lazy: screen(
          () => import('./routes/sign-in'),
          (m) => m.SignInRoute,
        ),
      },
      {
        path: paths.setPassword.path,
        lazy: screen(
          () => import('./routes/set-password'),
          (m) => m.SetPasswordRoute,
        ),
      },
      {
        id: 'signed-in',
        lazy: screen(
          () => import('./layout/authenticated-layout'),
          (m) => m.AuthenticatedLayout,
        ),
        children: [
          {
            path: paths.today.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/today'),
              (m) => m.TodayRoute,
            ),
          },
          {
            path: paths.changePassword.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/change-password'),
              (m) => m.ChangePasswordRoute,
            ),
          },
          {
            path: paths.people.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/people'),
              (m) => m.PeopleRoute,
            ),
          },
          {
            path: paths.patients.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/patients'),
              (m) => m.PatientsRoute,
            ),
          },
          {
            path: paths.patient.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/patients-record'),
              (m) => m.PatientRecordRoute,
            ),
          },
          {
            path: paths.orders.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/orders'),
              (m) => m.OrdersRoute,
            ),
          },
          {
            path: paths.newOrder.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/order-new'),
              (m) => m.NewOrderRoute,
            ),
          },
          {
            path: paths.order.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/order-detail'),
              (m) => m.OrderDetailRoute,
            ),
          },
          {
            path: paths.orderEdit.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/order-edit'),
              (m) => m.OrderEditRoute,
            ),
          },
          {
            path: paths.orderAmend.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/order-amend'),
              (m) => m.OrderAmendRoute,
            ),
          },
          {
            path: paths.orderDischarge.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/order-discharge'),
              (m) => m.OrderDischargeRoute,
            ),
          },
          {
            path: paths.protocols.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/protocols'),
              (m) => m.ProtocolsRoute,
            ),
          },
          {
            path: paths.protocolVersion.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/protocol-version'),
              (m) => m.ProtocolVersionRoute,
            ),
          },
          {
            path: paths.protocolCompare.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/protocol-compare'),
              (m) => m.ProtocolCompareRoute,
            ),
          },
          {
            path: paths.lightCalculator.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/light-calculator'),
              (m) => m.LightCalculatorRoute,
            ),
          },
          {
            path: paths.doseChecks.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/dose-checks'),
              (m) => m.DoseChecksRoute,
            ),
          },
          {
            path: paths.doseCheck.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/dose-check'),
              (m) => m.DoseCheckRoute,
            ),
          },
          {
            path: paths.outbox.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/outbox'),
              (m) => m.OutboxRoute,
            ),
          },
          {
            path: paths.orderCancelling.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/order-cancelling'),
              (m) => m.OrderCancellingRoute,
            ),
          },
          {
            path: paths.deviations.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/deviations'),
              (m) => m.DeviationsRoute,
            ),
          },
          {
            path: paths.deviation.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/deviation-review'),
              (m) => m.DeviationReviewRoute,
            ),
          },
          {
            path: paths.doseRecords.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/dose-records'),
              (m) => m.DoseRecordsRoute,
            ),
          },
          {
            path: paths.doseRecordPrint.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/dose-records'),
              (m) => m.DoseRecordPrintRoute,
            ),
          },
          {
            path: paths.lists.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/lists'),
              (m) => m.ListsRoute,
            ),
          },
          {
            path: paths.vialPlan.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/lists'),
              (m) => m.VialPlanRoute,
            ),
          },
          {
            path: paths.stock.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/stock'),
              (m) => m.StockRoute,
            ),
          },
          {
            path: paths.recall.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/stock'),
              (m) => m.RecallRoute,
            ),
          },
          {
            path: paths.drugUse.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/stock'),
              (m) => m.DrugUseRoute,
            ),
          },
          {
            path: paths.trends.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/trends'),
              (m) => m.TrendsRoute,
            ),
          },
          {
            path: paths.devices.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/devices'),
              (m) => m.DevicesRoute,
            ),
          },
          {
            path: paths.device.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/devices'),
              (m) => m.DeviceRoute,
            ),
          },
          {
            path: paths.outcomes.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/outcomes'),
              (m) => m.OutcomesRoute,
            ),
          },
          {
            path: paths.auditTrail.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/audit-trail'),
              (m) => m.AuditTrailRoute,
            ),
          },
          {
            path: paths.stepClock.path,
            errorElement: <RouteErrorScreen framed={false} />,
            lazy: screen(
              () => import('./routes/step-clock'),
              (m) => m.StepClockRoute,
            ),
          },
        ],
      },
      {
        path: '*',
        lazy: screen(
          () => import('./routes/not-found'),
          (m) => m.NotFoundRoute,
        ),
      },
    ],
  },
]);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
