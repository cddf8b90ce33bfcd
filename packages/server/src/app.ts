import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import express, { type Express } from 'express';
import helmet from 'helmet';
import { loadConfig, type Config } from './config/env';
import { connectDatabase, database } from './composition/database';
import { attachAbility } from './http/ability';
import { csrfGuard } from './http/csrf';
import { apiNotFound, errorHandler } from './http/error-handler';
import { configurePassport } from './http/passport';
import { createSessionMiddleware, enforceAbsoluteLifetime, sessionChecker } from './http/session';
import { refuseMalformedText } from './http/well-formed-text';
import { configureMailOutbox, startMailWorker } from './lib/mail-outbox';
import { configureMailer } from './lib/mailer';
import { configureStorage } from './lib/storage';
import { setLogLevel } from './lib/logger';
import type { RealtimeOptions } from './lib/realtime';
import { applicationRoutes, publicApplicationRoutes } from './modules/applications/applications.routes';
import { auditRoutes } from './modules/audit/audit.routes';
import { authRoutes } from './modules/auth/auth.routes';
import { coopRoutes } from './modules/coops/coops.routes';
import { invitationRoutes, memberRoutes } from './modules/members/members.routes';
import { farmRoutes } from './modules/farms/farms.routes';
import {
  animalNoteRoutes, animalRoutes, outsideAnimalRoutes, pedigreeCardRoutes, trialMatingRoutes, weighInRoutes,
} from './modules/animals/animals.routes';
import { breedRoutes } from './modules/breeds/breeds.routes';
import { weighingRoundRoutes } from './modules/weighing-rounds/weighing-rounds.routes';
import { herdExportRoutes, herdImportRoutes, hutchCardRoutes, pedigreeCertificateRoutes } from './modules/herd-files/herd-files.routes';
import { animalPhotoRoutes, farmPhotoRoutes, photoRoutes } from './modules/photos/photos.routes';
import { almanacRoutes, calendarFeedRoutes, serviceRoutes, treatmentRoutes, withdrawalRoutes } from './modules/almanac/almanac.routes';
import { heatCautionRoutes, temperatureRoutes } from './modules/health/health.routes';
import { processingMarkRoutes, processingRecordRoutes } from './modules/processing/processing.routes';
import { housingPlacementRoutes, housingRoutes, litterEventRoutes, litterRoutes } from './modules/litters/litters.routes';
import { growOutRoutes } from './modules/grow-out/grow-out.routes';
import { feedRoutes } from './modules/feed/feed.routes';
import { performanceRoutes } from './modules/performance/performance.routes';
import { cardWebhookRoutes, ledgerRoutes } from './modules/ledger/ledger.routes';
import { studShareRoutes } from './modules/stud-share/stud-share.routes';
import { swapBoardRoutes } from './modules/swap-board/swap-board.routes';
import { mentorshipRoutes } from './modules/mentorship/mentorship.routes';
import { notificationRoutes } from './modules/notifications/notifications.routes';
import { processingDayRoutes } from './modules/processing-days/processing-days.routes';
import { configureNotifications } from './modules/notifications/notifications.service';
import { chatRoutes, registerChatSocketEvents } from './modules/chat/chat.routes';
import { configureChat } from './modules/chat/chat.service';

const defaultClientDist = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../client/dist');

export interface AppHandle {
  app: Express;
  config: Config;
  /** What Socket.IO needs to share the HTTP session and drop sockets whose session has ended. */
  realtime: RealtimeOptions;
  close: () => Promise<void>;
}

/** Builds the Express app without listening (tests import this; server.ts listens). */
export function createApp(overrides: Partial<Config> = {}): AppHandle {
  const config = { ...loadConfig(), ...overrides };
  setLogLevel(config.logLevel);
  connectDatabase(config.databaseUrl, config.databasePoolMax);
  configureMailer(config.smtp);
  configureMailOutbox({ retryDelaySeconds: config.mail.retryDelaySeconds });
  configureNotifications({ appUrl: config.appUrl });
  configureChat(config.chat);
  registerChatSocketEvents();
  // Queued e-mail goes out from every process that serves the app (several instances share the queue).
  const stopMailWorker = config.mail.worker ? startMailWorker({ connectionString: config.databaseUrl, pollingIntervalSeconds: config.mail.pollingIntervalSeconds }) : null;
  configureStorage({ dir: config.uploads.dir, objectStore: config.objectStore });
  const passport = configurePassport();
  const session = createSessionMiddleware(config);

  const app = express();
  app.disable('x-powered-by');
  // Answers of the API are never cached (no-store below), so hashing each body for an ETag is work for nothing;
  // the client's files carry their own (express.static).
  app.set('etag', false);
  app.set('trust proxy', config.trustProxyHops);
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          defaultSrc: ["'self'"],
          scriptSrc: ["'self'"],
          styleSrc: ["'self'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          fontSrc: ["'self'"],
          connectSrc: ["'self'"],
          objectSrc: ["'none'"],
          baseUri: ["'self'"],
          formAction: ["'self'"],
          frameAncestors: ["'none'"],
          upgradeInsecureRequests: config.env === 'production' ? [] : null,
        },
      },
      strictTransportSecurity: config.env === 'production',
    }),
  );

  app.get('/api/health', async (_req, res) => {
    try {
      await database().query('SELECT 1');
      res.json({ status: 'ok', database: 'up' });
    } catch {
      res.status(503).json({ status: 'unavailable', database: 'down' });
    }
  });

  const api = express.Router();
  // Answers hold one person's herd and co-op: no shared or browser cache keeps them. A route that may
  // be cached (a photo, the calendar feed) says so itself.
  api.use((_req, res, next) => {
    res.setHeader('Cache-Control', 'no-store');
    next();
  });
  // The card service's webhooks: signed raw bodies, no session or CSRF header, so before the JSON parser.
  api.use('/card-webhooks', cardWebhookRoutes(config));
  api.use(express.json({ limit: '100kb' }), refuseMalformedText);
  api.use(session.middleware, enforceAbsoluteLifetime(config), passport.session(), attachAbility);
  api.use(csrfGuard(config.appUrl));
  api.use(authRoutes(config, passport));
  api.use('/farms/:farmId/photo', farmPhotoRoutes(config));
  api.use('/farms', farmRoutes());
  // Membership: the public application form, the admin's queue, roster, invitations, audit log, rules.
  api.use('/apply', publicApplicationRoutes(config));
  api.use('/applications', applicationRoutes(config));
  api.use('/members', memberRoutes(config));
  api.use('/invitations', invitationRoutes(config));
  api.use('/audit-events', auditRoutes());
  api.use('/coop', coopRoutes());
  // The Herd
  api.use('/breeds', breedRoutes());
  // Herd records in and out: photos, spreadsheet import and export, pedigree papers.
  api.use('/animals/:animalId/photos', animalPhotoRoutes(config));
  api.use('/photos', photoRoutes());
  api.use('/herd-imports', herdImportRoutes(config));
  api.use('/herd-export', herdExportRoutes());
  api.use('/pedigree-certificates', pedigreeCertificateRoutes());
  api.use('/hutch-cards', hutchCardRoutes(config));
  api.use('/animals', animalRoutes());
  api.use('/pedigree-cards', pedigreeCardRoutes());
  api.use('/trial-matings', trialMatingRoutes());
  api.use('/weigh-ins', weighInRoutes());
  api.use('/weighing-rounds', weighingRoundRoutes());
  api.use('/animal-notes', animalNoteRoutes());
  api.use('/outside-animals', outsideAnimalRoutes());
  // The Almanac and litters. The calendar feed answers a phone calendar with no session (secret address).
  api.use('/almanac', almanacRoutes(config));
  api.use('/services', serviceRoutes());
  api.use('/treatments', treatmentRoutes());
  api.use('/calendar-feeds', calendarFeedRoutes(config));
  api.use('/litters', litterRoutes());
  api.use('/litter-events', litterEventRoutes());
  api.use('/housing-units', housingRoutes());
  // Grow-out groups and the feed book.
  api.use('/grow-out', growOutRoutes());
  api.use('/feed', feedRoutes());
  api.use('/housing-placements', housingPlacementRoutes());
  // Health and yield: treatments' withdrawals, the barn's temperature, processing records and marks.
  api.use('/withdrawals', withdrawalRoutes());
  api.use('/temperature-readings', temperatureRoutes());
  api.use('/heat-caution', heatCautionRoutes());
  api.use('/processing-records', processingRecordRoutes());
  api.use('/processing-marks', processingMarkRoutes());
  api.use('/performance', performanceRoutes());
  // The Ledger: fees and balances between farms and the co-op, statements, dues and card payments.
  api.use('/ledger', ledgerRoutes(config));
  api.use('/stud-share', studShareRoutes());
  api.use('/swap-board', swapBoardRoutes());
  api.use('/notifications', notificationRoutes());
  api.use('/mentorship', mentorshipRoutes(config));
  // Co-op Chat: the channel, topics and the threads beside litters, processing days and loans.
  api.use('/chat', chatRoutes(config));
  // Processing days: sites, scheduled days, bookings with their waitlist, the roster, yields and the day's close.
  api.use('/processing-days', processingDayRoutes());
  api.use(apiNotFound);
  app.use('/api', api);

  const clientDist = config.clientDist ?? defaultClientDist;
  if (fs.existsSync(path.join(clientDist, 'index.html'))) {
    // Source maps would hand out the client's source; production builds keep them off the web.
    if (config.env === 'production') app.get(/\.map$/, (_req, res) => res.status(404).end());
    app.use(express.static(clientDist, { index: false, maxAge: '1h', setHeaders: immutableAssets }));
    // Client-side routes: every other GET gets the app shell.
    app.get(/^(?!\/api\/|\/socket\.io\/).*/, (_req, res) => res.sendFile(path.join(clientDist, 'index.html')));
  }
  app.use(errorHandler);

  return {
    app,
    config,
    realtime: {
      handshake: [session.middleware, enforceAbsoluteLifetime(config), passport.session()],
      appUrl: config.appUrl,
      isSessionCurrent: sessionChecker(session.store, config),
      sessionCheckSeconds: config.socketSessionCheckSeconds,
      acrossInstances: config.realtimeAcrossInstances ? { connectionString: config.databaseUrl } : null,
    },
    close: async () => {
      await stopMailWorker?.();
      await session.pool.end();
    },
  };
}

function immutableAssets(res: express.Response, filePath: string) {
  if (filePath.includes(`${path.sep}assets${path.sep}`)) res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
}
