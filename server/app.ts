import 'reflect-metadata';
import { existsSync } from 'node:fs';
import path from 'node:path';
import cookieParser from 'cookie-parser';
import { setUnitLocale } from '../shared/format/figures';
import express, { type Express } from 'express';
import helmet from 'helmet';
import { createAuditRepository } from './audit/repository';
import { auditRoutes } from './audit/routes';
import { createAuditService, createReadAudit } from './audit/service';
import { authRoutes } from './auth/routes';
import { createAuthService } from './auth/service';
import { createPasswordLinkRepository } from './auth/password-link-repository';
import { createPasswordLinks } from './auth/password-links';
import { createSignInSessions } from './auth/sign-in-session';
import { createSignInSessionRepository } from './auth/sign-in-session-repository';
import { createThrottle } from './auth/throttle';
import { createThrottleRepository } from './auth/throttle-repository';
import { calculationRoutes } from './calculations/routes';
import { createCalculationService } from './calculations/service';
import { systemClock, type Clock } from './clock';
import type { Config } from './config';
import { createUnitOfWork, type Database } from './db/unit-of-work';
import { createEndedTreatmentQueries, createFollowUpRepository } from './follow-up/repository';
import { createOutcomeService } from './follow-up/outcomes';
import { followUpRoutes } from './follow-up/routes';
import { createFollowUpService } from './follow-up/service';
import { createHealthRepository } from './health/repository';
import { healthRoutes } from './health/routes';
import { createHealthService } from './health/service';
import { createFhirGateway } from './fhir/client';
import { createFhirRepository } from './fhir/repository';
import { fhirRoutes } from './fhir/routes';
import { createFhirService } from './fhir/service';
import { AppError } from './http/app-error';
import { errorHandler } from './http/error-handler';
import { mountRoutes, type RouteSpec } from './http/route-table';
import { sameOriginOnly } from './http/same-origin';
import type { Mailer } from './mail/mailer';
import { createAttachmentRepository } from './attachments/repository';
import { attachmentRoutes } from './attachments/routes';
import { createAttachmentService } from './attachments/service';
import { createOutboxRepository } from './mail/outbox-repository';
import { outboxRoutes } from './mail/outbox-routes';
import { createOutboxService } from './mail/service';
import { createOrderRepository } from './orders/repository';
import { orderRoutes } from './orders/routes';
import { createOrderService } from './orders/service';
import { createDeviceRepository } from './devices/repository';
import { deviceRoutes } from './devices/routes';
import { createDeviceService } from './devices/service';
import { createPatientRepository } from './patients/repository';
import { patientRoutes } from './patients/routes';
import { createPatientService } from './patients/service';
import { createRoleRequestRepository, createUserRepository } from './people/repository';
import { pharmacyRoutes } from './pharmacy/routes';
import { createPharmacyService } from './pharmacy/service';
import { createDischargeService } from './sessions/discharge';
import { createSessionRepository } from './sessions/repository';
import { sessionRoutes } from './sessions/routes';
import { createSessionService } from './sessions/service';
import { createReviewRepository } from './review/repository';
import { reviewRoutes } from './review/routes';
import { createReviewService } from './review/service';
import { staffRoutes } from './review/staff-routes';
import { peopleRoutes } from './people/routes';
import { createPeopleService } from './people/service';
import { createProtocolRepository } from './protocols/repository';
import { protocolRoutes } from './protocols/routes';
import { createProtocolService } from './protocols/service';
import { todayRoutes } from './today/routes';
import { createListRepository } from './lists/repository';
import { listRoutes } from './lists/routes';
import { createListService } from './lists/service';
import { createStockRepository } from './stock/repository';
import { stockRoutes } from './stock/routes';
import { createStockService } from './stock/service';
import { createTodayService } from './today/service';

export interface AppDependencies {
  config: Config;
  dataSource: Database;
  mailer: Mailer;
  /** The built client to serve; left out, the app serves the API only. */
  clientDir?: string;
  /** The server's one clock, handed to every service; tests that run sessions in accelerated time replace it. */
  clock?: Clock;
}

/** Builds the Express app; `server/index.ts` decides where it listens. */
export function createApp({
  config,
  dataSource,
  clientDir,
  clock = systemClock,
}: AppDependencies): Express {
  // Every date the server writes (sheets, e-mails, refusals) is in the unit's locale.
  setUnitLocale(config.UNIT_LOCALE);
  const app = express();
  app.disable('x-powered-by');
  // API answers are never cached (Cache-Control: no-store), so hashing each body for an ETag is
  // wasted work; the built client's files get theirs from express.static.
  app.set('etag', false);
  app.set('trust proxy', config.TRUST_PROXY);

  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          // Plain http on loopback: an upgrade would break every request.
          upgradeInsecureRequests: config.COOKIE_SECURE ? [] : null,
          imgSrc: ["'self'", 'data:', 'blob:'],
        },
      },
      hsts: config.COOKIE_SECURE,
    }),
  );

  const unitOfWork = createUnitOfWork(dataSource);
  const audit = createAuditRepository(dataSource);
  const reads = createReadAudit(audit, clock);
  const users = createUserRepository(dataSource);
  const signInSessions = createSignInSessionRepository(dataSource);
  const signIn = createSignInSessions(config, signInSessions);
  const passwordLinkRows = createPasswordLinkRepository(dataSource);
  const auth = createAuthService({
    unitOfWork,
    users,
    signInSessions,
    links: passwordLinkRows,
    throttle: createThrottle(createThrottleRepository(dataSource), config),
    audit,
  });
  const passwordLinks = createPasswordLinks(unitOfWork, passwordLinkRows, config);
  const protocols = createProtocolService(
    createProtocolRepository(dataSource),
    audit,
    auth.confirmSignature,
    clock,
  );
  const patients = createPatientRepository(dataSource);
  const orders = createOrderRepository(dataSource);
  const deviceRows = createDeviceRepository(dataSource);
  const unitTimeZone = config.UNIT_TIME_ZONE;
  const weightChangeRule = {
    maxPct: config.WEIGHT_CHANGE_MAX_PCT,
    withinDays: config.WEIGHT_CHANGE_WITHIN_DAYS,
  };
  const followUpRows = createFollowUpRepository(dataSource);
  const followUp = createFollowUpService({
    unitOfWork,
    clock,
    followUps: followUpRows,
    treatments: createEndedTreatmentQueries(dataSource),
    audit,
    unitTimeZone,
    unitName: config.UNIT_NAME,
    uploadDir: path.resolve(config.UPLOAD_DIR),
  });
  const orderService = createOrderService({
    unitOfWork,
    clock,
    orders,
    patients,
    users,
    protocols,
    audit,
    reads,
    unitTimeZone,
    weightChangeRule,
    lenses: deviceRows,
    confirmSignature: auth.confirmSignature,
    latestRetreatmentDecision: followUp.latestDecision,
  });
  const stock = createStockService({
    unitOfWork,
    stock: createStockRepository(dataSource),
    audit,
    clock,
    unitTimeZone,
  });
  const lists = createListService({
    unitOfWork,
    lists: createListRepository(dataSource),
    orders,
    audit,
    clock,
    unitTimeZone,
    vialSharingAllowed: config.VIAL_SHARING_ALLOWED,
  });
  const pharmacy = createPharmacyService({
    unitOfWork,
    orders,
    orderService,
    users,
    audit,
    unitTimeZone,
    clock,
    stock,
    vialSharingAllowed: config.VIAL_SHARING_ALLOWED,
  });
  const fhir = createFhirService({
    gateway: config.FHIR_BASE_URL
      ? createFhirGateway(config.FHIR_BASE_URL, config.FHIR_TIMEOUT_MS)
      : null,
    fhir: createFhirRepository(dataSource),
    audit,
    reads,
    clock,
  });
  const sessionRows = createSessionRepository(dataSource);
  const checkValidity =
    config.OUTPUT_CHECK_VALID_H === undefined
      ? ({ kind: 'unit-day' } as const)
      : ({ kind: 'hours', hours: config.OUTPUT_CHECK_VALID_H } as const);
  const sessionService = createSessionService({
    devices: deviceRows,
    checkValidity,
    unitOfWork,
    orders,
    sessions: sessionRows,
    users,
    audit,
    unitTimeZone,
    clock,
    tapClockSkewS: config.TAP_CLOCK_SKEW_S,
    tapOfflineWindowH: config.TAP_OFFLINE_WINDOW_H,
    confirmSignature: auth.confirmSignature,
    treatmentRecords: fhir,
    afterSessionCompleted: () => followUp.sweep(),
  });
  const discharge = createDischargeService({
    unitOfWork,
    clock,
    orders,
    sessions: sessionRows,
    audit,
    unitName: config.UNIT_NAME,
    unitPhone: config.UNIT_PHONE,
    unitTimeZone,
  });
  const people = createPeopleService({
    unitOfWork,
    users,
    roleRequests: createRoleRequestRepository(dataSource),
    signInSessions,
    passwordLinks,
    audit,
  });

  const routes: RouteSpec[] = [
    ...healthRoutes(createHealthService(createHealthRepository(dataSource)), {
      name: config.UNIT_NAME,
      timeZone: config.UNIT_TIME_ZONE,
      locale: config.UNIT_LOCALE,
      phone: config.UNIT_PHONE,
    }),
    ...authRoutes(auth, signIn),
    ...peopleRoutes(people),
    ...protocolRoutes(protocols),
    ...calculationRoutes(createCalculationService(protocols)),
    ...patientRoutes(
      createPatientService(
        patients,
        orders,
        audit,
        reads,
        weightChangeRule,
        config.FHIR_BASE_URL ? fhir.sourceForNewPatient : undefined,
      ),
    ),
    ...fhirRoutes(fhir),
    ...todayRoutes(createTodayService({ orders, clock, lists })),
    ...orderRoutes(orderService),
    ...pharmacyRoutes(pharmacy),
    ...listRoutes(lists),
    ...stockRoutes(stock),
    ...attachmentRoutes(
      createAttachmentService(
        createAttachmentRepository(dataSource),
        audit,
        reads,
        path.resolve(config.UPLOAD_DIR),
      ),
    ),
    ...outboxRoutes(createOutboxService(createOutboxRepository(dataSource))),
    ...sessionRoutes(sessionService, discharge),
    ...deviceRoutes(
      createDeviceService({
        unitOfWork,
        devices: deviceRows,
        audit,
        clock,
        unitTimeZone,
        checkValidity,
      }),
    ),
    ...followUpRoutes(
      followUp,
      createOutcomeService({
        clock,
        followUps: followUpRows,
        planMissing: () => followUp.planMissing(),
        unitTimeZone,
      }),
    ),
    ...staffRoutes(people),
    ...auditRoutes(createAuditService(audit)),
    ...reviewRoutes(
      createReviewService({
        unitOfWork,
        clock,
        reviews: createReviewRepository(dataSource),
        sessions: sessionService,
        audit,
        reads,
        unitTimeZone,
      }),
    ),
  ];
  app.locals.routeTable = routes;
  // The web server runs this now and then: plans missed follow-up and queues due reminders.
  app.locals.followUpSweep = () => followUp.sweep();

  const api = express.Router();
  api.use(express.json({ limit: '200kb' }));
  api.use(cookieParser());
  api.use(sameOriginOnly);
  api.use((_req, res, next) => {
    res.set('Cache-Control', 'no-store');
    next();
  });
  mountRoutes(api, routes, {
    signIn: signIn.requireSignIn,
    capability: signIn.requireCapability,
  });
  api.use((req, _res, next) =>
    next(AppError.notFound(`There is no API route ${req.method} ${req.baseUrl}${req.path}.`)),
  );
  app.use('/api', api);

  if (clientDir && existsSync(path.join(clientDir, 'index.html'))) {
    app.use(
      express.static(clientDir, {
        index: false,
        maxAge: '1h',
        // The service worker and the page it falls back to are checked on every load, so a new build reaches tablets at once.
        setHeaders: (res, filePath) => {
          const name = path.basename(filePath);
          if (name === 'sw.js' || name === 'index.html') res.setHeader('Cache-Control', 'no-cache');
        },
      }),
    );
    // The client routes in the browser: every other GET gets the app's page.
    app.get(/^\/(?!api\/).*/, (_req, res) => {
      res.set('Cache-Control', 'no-cache');
      res.sendFile(path.join(clientDir, 'index.html'));
    });
  }

  app.use(errorHandler);
  return app;
}
