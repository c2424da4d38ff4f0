import express, { type Express } from 'express';
import helmet from 'helmet';
import { existsSync } from 'node:fs';
import path from 'node:path';
import type { Knex } from 'knex';
import type { AppConfig } from './config';
import { apiNotFound, errorHandler } from './middleware/error-handler';
import { loadUser, requireSession } from './middleware/require-session';
import { bearerAuth, unlessBearer } from './middleware/bearer';
import { sessionMiddleware } from './middleware/session';
import { csrfProtection } from './middleware/csrf';
import { idempotentCreates } from './middleware/idempotency';
import { jsonBodiesOnly } from './middleware/json-only';
import { IdempotencyRepository } from './repositories/idempotency-repository';
import { createMailer, type Mailer } from './mail/mailer';
import { adminRoutes } from './routes/admin';
import { apiTokenRoutes } from './routes/api-tokens';
import { authRoutes } from './routes/auth';
import { campaignRoutes } from './routes/campaigns';
import { demoRecordingFiles, demoRecordingListRoutes } from './routes/demo-recordings';
import { healthRoutes } from './routes/health';
import { invitationRoutes } from './routes/invitations';
import { markRoutes } from './routes/marks';
import { notificationRoutes } from './routes/notifications';
import { outboxRoutes } from './routes/outbox';
import { projectRoutes } from './routes/projects';
import { recordingRoutes } from './routes/recordings';
import { shareLinkRoutes } from './routes/share-links';
import { targetRoutes } from './routes/targets';
import { viewRoutes } from './routes/views';
import { AdminService } from './services/admin-service';
import { ApiTokenService } from './services/api-token-service';
import { AuthService } from './services/auth-service';
import { CampaignService } from './services/campaign-service';
import { InvitationService } from './services/invitation-service';
import { MarkService } from './services/mark-service';
import { NotificationService } from './services/notification-service';
import { PasswordResetService } from './services/password-reset-service';
import { ProjectService } from './services/project-service';
import { RecordingService } from './services/recording-service';
import { ShareLinkService } from './services/share-link-service';
import { TargetService } from './services/target-service';
import { ViewSaveService } from './services/view-save-service';
import { ViewService } from './services/view-service';

export const JSON_BODY_LIMIT = '200kb';
/** A CSV of targets may hold 200 kB of text; as a JSON string (escaped line ends, UTF-8) it needs a little more. */
const TARGET_IMPORT_BODY_LIMIT = '300kb';
const TARGET_IMPORT_PATH = /^\/projects\/[^/]+\/targets\/import$/;
/** A campaign result keeps an inverter object of up to 256 kB; a campaign's per-file tags may list thousands of files. */
const CAMPAIGN_BODY_LIMIT = '1mb';
const CAMPAIGN_PATH = /^\/projects\/[^/]+\/campaigns(?:\/[^/]+(?:\/results)?)?$/;

export interface AppDeps {
  config: AppConfig;
  db: Knex;
  mailer?: Mailer;
}

export interface FanlightApp {
  app: Express;
  /** Stops timers the app owns (the session store's cleanup), so a test process can exit. */
  close(): void;
}

export function createApp({ config, db, mailer = createMailer(config.smtp) }: AppDeps): FanlightApp {
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', config.trustProxy);

  app.use(
    helmet({
      // Cross-origin isolation (with helmet's default same-origin opener policy): the Bench keeps the
      // map's mean squares in a SharedArrayBuffer that its analysis workers read without a copy.
      crossOriginEmbedderPolicy: { policy: 'require-corp' },
      contentSecurityPolicy: {
        useDefaults: true,
        directives: {
          // Our workers instantiate the FFT's WebAssembly; nothing else is evaluated.
          'script-src': ["'self'", "'wasm-unsafe-eval'"],
          'worker-src': ["'self'", 'blob:'],
          'connect-src': ["'self'"],
          'img-src': ["'self'", 'data:', 'blob:'],
          // Fonts ship with the app: nothing is fetched from another host.
          'font-src': ["'self'"],
          'style-src': ["'self'", "'unsafe-inline'"],
          'upgrade-insecure-requests': config.trustProxy ? [] : null,
        },
      },
    }),
  );

  const auth = new AuthService(db);
  const session = sessionMiddleware(db, config.sessionSecret);
  const invitations = new InvitationService(db, mailer, config.publicOrigin);
  const notifications = new NotificationService(db, mailer, config.publicOrigin);
  const views = new ViewService(db, notifications);
  const idempotency = idempotentCreates(new IdempotencyRepository(db), config.sessionSecret);

  const api = express.Router();
  const jsonBody = express.json({ limit: JSON_BODY_LIMIT });
  const importBody = express.json({ limit: TARGET_IMPORT_BODY_LIMIT });
  const campaignBody = express.json({ limit: CAMPAIGN_BODY_LIMIT });
  api.use((req, res, next) =>
    (TARGET_IMPORT_PATH.test(req.path) ? importBody : CAMPAIGN_PATH.test(req.path) ? campaignBody : jsonBody)(req, res, next),
  );
  api.use(healthRoutes(db));
  if (config.env !== 'production') api.use(outboxRoutes(config.smtp.outboxDir));
  // Authorization: Bearer (an API token) instead of a session: no session is read, no CSRF token needed
  api.use(bearerAuth(new ApiTokenService(db), auth));
  api.use(unlessBearer(session.middleware));
  api.use(unlessBearer(loadUser(auth)));
  api.use(unlessBearer(csrfProtection([config.publicOrigin, ...config.extraOrigins])));
  // the routes that take a file check their own types (the snapshot, and a view saved whole)
  api.use(jsonBodiesOnly([/^\/projects\/[^/]+\/views$/, /^\/views\/[^/]+$/], [/^\/views\/[^/]+\/snapshot$/]));
  api.use(idempotency.middleware);
  api.use(authRoutes(auth, new PasswordResetService(db, mailer, config.publicOrigin)));
  api.use(projectRoutes(new ProjectService(db), invitations));
  api.use(recordingRoutes(new RecordingService(db)));
  api.use(targetRoutes(new TargetService(db)));
  api.use(campaignRoutes(new CampaignService(db)));
  api.use(viewRoutes(views, new ViewSaveService(db, views, notifications)));
  api.use(markRoutes(new MarkService(db, notifications)));
  api.use(shareLinkRoutes(new ShareLinkService(db, views, notifications, config.publicOrigin)));
  api.use(notificationRoutes(notifications));
  api.use(apiTokenRoutes(new ApiTokenService(db)));
  api.use(invitationRoutes(invitations));
  api.use(demoRecordingListRoutes(config.demoRecordingsDir));
  api.use(adminRoutes(new AdminService(db)));
  api.use(apiNotFound);
  app.use('/api', api);
  // Demo recordings are files for signed-in users: the session is read here as on /api.
  app.use('/demo-recordings', session.middleware, loadUser(auth), requireSession, demoRecordingFiles(config.demoRecordingsDir), errorHandler);

  if (existsSync(path.join(config.clientDir, 'index.html'))) {
    app.use(
      '/assets',
      express.static(path.join(config.clientDir, 'assets'), { immutable: true, maxAge: '365d', fallthrough: false }),
    );
    app.use(express.static(config.clientDir, { index: false }));
    // Client-side routes: every other GET gets the single page.
    app.get('/{*splat}', (_req, res) => {
      // root + relative name: `send` refuses dot-folders only below root (the tests build into .data/).
      res.sendFile('index.html', { root: config.clientDir });
    });
  }

  app.use(errorHandler);

  return {
    app,
    close() {
      mailer.close();
      session.store.close();
      auth.close();
      idempotency.close();
    },
  };
}
