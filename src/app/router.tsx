import { Suspense, lazy, useLayoutEffect, type ComponentType } from 'react';
import { BrowserRouter, Route, Routes, useLocation, useNavigationType } from 'react-router-dom';
import { ErrorBoundary } from '../components/ui/error-boundary';
import { LoadingPanel } from '../components/ui/status-panel';
import { paths } from '../config/paths';
import { PlainPage } from './layout/plain-page';
import { RouteErrorScreen } from './routes/route-error';

/*
 * Every screen is loaded on demand (React.lazy), so the sign-in page downloads only what it
 * needs; the table, the people forms and later the step clock arrive when a signed-in person
 * opens them. The routes are declared as components (not a data router): the app loads its data
 * with TanStack Query, and the data router's own code would come with every first page.
 * A navigation is a transition and the loading boundaries stay in place (one around the routes,
 * one around the signed-in screens in ./layout/app-shell.tsx), so the screen on show stays until
 * the next one has loaded, and focus then moves to its heading; a loading status shows only
 * while a page's first screen loads. The service worker precaches every screen's file, so the
 * step clock reopens offline.
 */
function screen<TModule>(load: () => Promise<TModule>, pick: (module: TModule) => ComponentType) {
  return lazy(async () => ({ default: pick(await load()) }));
}

const SignInRoute = screen(
  () => import('./routes/sign-in'),
  (m) => m.SignInRoute,
);
const SetPasswordRoute = screen(
  () => import('./routes/set-password'),
  (m) => m.SetPasswordRoute,
);
const TodayRoute = screen(
  () => import('./routes/today'),
  (m) => m.TodayRoute,
);
const ChangePasswordRoute = screen(
  () => import('./routes/change-password'),
  (m) => m.ChangePasswordRoute,
);
const PeopleRoute = screen(
  () => import('./routes/people'),
  (m) => m.PeopleRoute,
);
const PatientsRoute = screen(
  () => import('./routes/patients'),
  (m) => m.PatientsRoute,
);
const PatientRecordRoute = screen(
  () => import('./routes/patients-record'),
  (m) => m.PatientRecordRoute,
);
const OrdersRoute = screen(
  () => import('./routes/orders'),
  (m) => m.OrdersRoute,
);
const NewOrderRoute = screen(
  () => import('./routes/order-new'),
  (m) => m.NewOrderRoute,
);
const OrderDetailRoute = screen(
  () => import('./routes/order-detail'),
  (m) => m.OrderDetailRoute,
);
const OrderEditRoute = screen(
  () => import('./routes/order-edit'),
  (m) => m.OrderEditRoute,
);
const OrderAmendRoute = screen(
  () => import('./routes/order-amend'),
  (m) => m.OrderAmendRoute,
);
const OrderDischargeRoute = screen(
  () => import('./routes/order-discharge'),
  (m) => m.OrderDischargeRoute,
);
const ProtocolsRoute = screen(
  () => import('./routes/protocols'),
  (m) => m.ProtocolsRoute,
);
const ProtocolVersionRoute = screen(
  () => import('./routes/protocol-version'),
  (m) => m.ProtocolVersionRoute,
);
const ProtocolCompareRoute = screen(
  () => import('./routes/protocol-compare'),
  (m) => m.ProtocolCompareRoute,
);
const LightCalculatorRoute = screen(
  () => import('./routes/light-calculator'),
  (m) => m.LightCalculatorRoute,
);
const DoseChecksRoute = screen(
  () => import('./routes/dose-checks'),
  (m) => m.DoseChecksRoute,
);
const DoseCheckRoute = screen(
  () => import('./routes/dose-check'),
  (m) => m.DoseCheckRoute,
);
const OutboxRoute = screen(
  () => import('./routes/outbox'),
  (m) => m.OutboxRoute,
);
const OrderCancellingRoute = screen(
  () => import('./routes/order-cancelling'),
  (m) => m.OrderCancellingRoute,
);
const DeviationsRoute = screen(
  () => import('./routes/deviations'),
  (m) => m.DeviationsRoute,
);
const DeviationReviewRoute = screen(
  () => import('./routes/deviation-review'),
  (m) => m.DeviationReviewRoute,
);
const DoseRecordsRoute = screen(
  () => import('./routes/dose-records'),
  (m) => m.DoseRecordsRoute,
);
const DoseRecordPrintRoute = screen(
  () => import('./routes/dose-records'),
  (m) => m.DoseRecordPrintRoute,
);
const ListsRoute = screen(
  () => import('./routes/lists'),
  (m) => m.ListsRoute,
);
const VialPlanRoute = screen(
  () => import('./routes/lists'),
  (m) => m.VialPlanRoute,
);
const StockRoute = screen(
  () => import('./routes/stock'),
  (m) => m.StockRoute,
);
const RecallRoute = screen(
  () => import('./routes/stock'),
  (m) => m.RecallRoute,
);
const DrugUseRoute = screen(
  () => import('./routes/stock'),
  (m) => m.DrugUseRoute,
);
const TrendsRoute = screen(
  () => import('./routes/trends'),
  (m) => m.TrendsRoute,
);
const DevicesRoute = screen(
  () => import('./routes/devices'),
  (m) => m.DevicesRoute,
);
const DeviceRoute = screen(
  () => import('./routes/devices'),
  (m) => m.DeviceRoute,
);
const OutcomesRoute = screen(
  () => import('./routes/outcomes'),
  (m) => m.OutcomesRoute,
);
const AuditTrailRoute = screen(
  () => import('./routes/audit-trail'),
  (m) => m.AuditTrailRoute,
);
const StepClockRoute = screen(
  () => import('./routes/step-clock'),
  (m) => m.StepClockRoute,
);
const NotFoundRoute = screen(
  () => import('./routes/not-found'),
  (m) => m.NotFoundRoute,
);
const AuthenticatedLayout = screen(
  () => import('./layout/authenticated-layout'),
  (m) => m.AuthenticatedLayout,
);

/**
 * One screen with its error screen. A screen that fails to load (its file could not be fetched:
 * a network drop, or a new release replaced it) or to render shows the error screen; moving to
 * another address tries again. `framed` screens stand alone (sign-in, the signed-in layout); the
 * others sit inside the signed-in layout's frame.
 */
function Screen({
  component: Component,
  framed = false,
}: {
  component: ComponentType;
  framed?: boolean;
}) {
  const { pathname } = useLocation();
  return (
    <ErrorBoundary resetKey={pathname} fallback={<RouteErrorScreen framed={framed} />}>
      <Component />
    </ErrorBoundary>
  );
}

/** A new screen opens at its top; going back or forward leaves the browser's own scroll restoring. */
function ScrollToTopOnNewScreen() {
  const { pathname } = useLocation();
  const navigationType = useNavigationType();
  useLayoutEffect(() => {
    if (navigationType !== 'POP') window.scrollTo(0, 0);
  }, [pathname, navigationType]);
  return null;
}

export function AppRouter() {
  return (
    <BrowserRouter>
      <ScrollToTopOnNewScreen />
      <Suspense
        fallback={
          <PlainPage>
            <LoadingPanel label="Starting Luxtempo…" />
          </PlainPage>
        }
      >
        <Routes>
          <Route path={paths.signIn.path} element={<Screen component={SignInRoute} framed />} />
          <Route
            path={paths.setPassword.path}
            element={<Screen component={SetPasswordRoute} framed />}
          />
          <Route element={<Screen component={AuthenticatedLayout} framed />}>
            <Route path={paths.today.path} element={<Screen component={TodayRoute} />} />
            <Route
              path={paths.changePassword.path}
              element={<Screen component={ChangePasswordRoute} />}
            />
            <Route path={paths.people.path} element={<Screen component={PeopleRoute} />} />
            <Route path={paths.patients.path} element={<Screen component={PatientsRoute} />} />
            <Route path={paths.patient.path} element={<Screen component={PatientRecordRoute} />} />
            <Route path={paths.orders.path} element={<Screen component={OrdersRoute} />} />
            <Route path={paths.newOrder.path} element={<Screen component={NewOrderRoute} />} />
            <Route path={paths.order.path} element={<Screen component={OrderDetailRoute} />} />
            <Route path={paths.orderEdit.path} element={<Screen component={OrderEditRoute} />} />
            <Route path={paths.orderAmend.path} element={<Screen component={OrderAmendRoute} />} />
            <Route
              path={paths.orderDischarge.path}
              element={<Screen component={OrderDischargeRoute} />}
            />
            <Route path={paths.protocols.path} element={<Screen component={ProtocolsRoute} />} />
            <Route
              path={paths.protocolVersion.path}
              element={<Screen component={ProtocolVersionRoute} />}
            />
            <Route
              path={paths.protocolCompare.path}
              element={<Screen component={ProtocolCompareRoute} />}
            />
            <Route
              path={paths.lightCalculator.path}
              element={<Screen component={LightCalculatorRoute} />}
            />
            <Route path={paths.doseChecks.path} element={<Screen component={DoseChecksRoute} />} />
            <Route path={paths.doseCheck.path} element={<Screen component={DoseCheckRoute} />} />
            <Route path={paths.outbox.path} element={<Screen component={OutboxRoute} />} />
            <Route
              path={paths.orderCancelling.path}
              element={<Screen component={OrderCancellingRoute} />}
            />
            <Route path={paths.deviations.path} element={<Screen component={DeviationsRoute} />} />
            <Route
              path={paths.deviation.path}
              element={<Screen component={DeviationReviewRoute} />}
            />
            <Route
              path={paths.doseRecords.path}
              element={<Screen component={DoseRecordsRoute} />}
            />
            <Route
              path={paths.doseRecordPrint.path}
              element={<Screen component={DoseRecordPrintRoute} />}
            />
            <Route path={paths.lists.path} element={<Screen component={ListsRoute} />} />
            <Route path={paths.vialPlan.path} element={<Screen component={VialPlanRoute} />} />
            <Route path={paths.stock.path} element={<Screen component={StockRoute} />} />
            <Route path={paths.recall.path} element={<Screen component={RecallRoute} />} />
            <Route path={paths.drugUse.path} element={<Screen component={DrugUseRoute} />} />
            <Route path={paths.trends.path} element={<Screen component={TrendsRoute} />} />
            <Route path={paths.devices.path} element={<Screen component={DevicesRoute} />} />
            <Route path={paths.device.path} element={<Screen component={DeviceRoute} />} />
            <Route path={paths.outcomes.path} element={<Screen component={OutcomesRoute} />} />
            <Route path={paths.auditTrail.path} element={<Screen component={AuditTrailRoute} />} />
            <Route path={paths.stepClock.path} element={<Screen component={StepClockRoute} />} />
          </Route>
          <Route path="*" element={<Screen component={NotFoundRoute} framed />} />
        </Routes>
      </Suspense>
    </BrowserRouter>
  );
}
