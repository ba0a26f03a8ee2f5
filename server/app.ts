/**
 * The Express application factory. Tests import `createApp` with their own database and
 * configuration; `server/index.ts` only listens.
 *
 * Order: security headers → request log → sign-in limit per client address → compression →
 * cookies → JSON body (size-limited) → /api routes (health open; auth; everything else behind
 * authentication, CSRF and the temporary-password check, each route declaring its permitted
 * roles) → API 404 → built client with SPA fallback → one error handler. The client's hashed assets are cached for a year (their names
 * change with their content); index.html is revalidated on every load.
 */
import express, { type Express } from 'express';
import helmet from 'helmet';
import cookieParser from 'cookie-parser';
import compression from 'compression';
import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import { sql } from 'drizzle-orm';
import type { Config } from './config/env.js';
import type { Db } from './db/client.js';
import { authenticate, configurePassport, requireCsrf, requirePasswordChanged } from './auth/passport.js';
import { addressLimiter, authRouter } from './auth/authRouter.js';
import { projectRouter } from './api/projects/projectRouter.js';
import { deckRouter, projectDecksRouter } from './api/decks/deckRouter.js';
import { userRouter } from './api/users/userRouter.js';
import { errorHandler, notFoundHandler } from './middleware/errors.js';
import { PRODUCT_VERSION, SOLVER_VERSION } from '../shared/version.js';
import { disabledMailer, type Mailer } from './mail/mailer.js';
import { invitationRouter } from './api/mail/invitationRouter.js';
import { mailRouter } from './api/mail/mailRouter.js';
import { attachmentRouter, projectAttachmentsRouter } from './api/attachments/attachmentRouter.js';
import { defaultAttachmentsDir } from './api/attachments/attachmentStore.js';
import { reviewRouter } from './api/reviews/reviewRouter.js';
import { trainingRouter } from './api/training/trainingRouter.js';
import { importRouter } from './api/imports/importRouter.js';
import { reportRouter } from './reports/reportRouter.js';
import { refinedPoolFor, type RefinedPool } from './compute/refinedPool.js';
import { packagePoolFor, type PackagePool } from './compute/packagePool.js';
import { databaseJobRecorder, failInterruptedJobs } from './compute/jobRecords.js';
import { jobRouter, versionJobsRouter } from './api/jobs/jobRouter.js';
import { versionFactorsRouter } from './api/decks/versionFactors.js';
import { StudyRunner, interruptStudies } from './compute/studyRunner.js';
import { projectStudiesRouter, studyRouter } from './api/studies/studyRouter.js';

export interface AppDeps {
  db: Db;
  config: Config;
  log?: (line: string) => void;
  /** Outgoing e-mail (server/mail); without one, notices are logged and dropped. */
  mailer?: Mailer;
  /** Folder for uploaded drawings (default: "attachments" beside the database file). */
  attachmentsDir?: string;
  /** Worker pool of the refined (grillage) analyses (server/compute); the caller closes it. Without one, the app makes its own from `config` (`app.locals.refinedPool`). */
  refinedPool?: RefinedPool;
  /** Worker pool that lays out the calculation packages; the caller closes it. Without one, the app makes its own from `config` (`app.locals.packagePool`). */
  packagePool?: PackagePool;
  /** Runs the parameter studies; the caller closes it. Without one, the app makes its own (`app.locals.studyRunner`). */
  studyRunner?: StudyRunner;
}

/** Helmet's headers; HSTS and upgrade-insecure-requests only when served over HTTPS. */
function securityHeaders(config: Config) {
  const https = config.secureCookies;
  return helmet({
    strictTransportSecurity: https,
    contentSecurityPolicy: {
      directives: {
        'script-src': ["'self'"],
        'worker-src': ["'self'", 'blob:'],
        'img-src': ["'self'", 'data:', 'blob:'],
        'upgrade-insecure-requests': https ? [] : null,
      },
    },
  });
}

export function createApp({ db, config, log = (l) => console.log(l), mailer = disabledMailer(log, 'no mailer configured'), attachmentsDir, refinedPool, packagePool, studyRunner }: AppDeps): Express {
  const app = express();
  const pool = refinedPool ?? refinedPoolFor(config);
  app.locals.refinedPool = pool;
  const packages = packagePool ?? packagePoolFor(config);
  app.locals.packagePool = packages;
  // Jobs a stopped server left unfinished are failed with the reason; every new one is recorded.
  const interrupted = failInterruptedJobs(db);
  if (interrupted > 0) log(`${interrupted} compute job(s) left unfinished by the last run of the server were marked failed`);
  // Studies a stopped server left running keep their points and may be resumed.
  const stopped = interruptStudies(db);
  if (stopped > 0) log(`${stopped} study(ies) left running by the last run of the server were marked interrupted (resumable)`);
  const studiesRunner = studyRunner ?? new StudyRunner(db, { threads: config.refinedThreads, workerMemoryMb: config.refinedWorkerMemoryMb, maxNodeGirders: config.refinedMaxNodeGirders, log });
  app.locals.studyRunner = studiesRunner;
  const recorder = databaseJobRecorder(db, log);
  pool.recordJobs(recorder);
  packages.recordJobs(recorder);
  const filesDir = attachmentsDir ?? defaultAttachmentsDir(config.databaseUrl);
  app.disable('x-powered-by');
  // Off unless TRUST_PROXY names the proxy: a client cannot pick its own address (rate limits).
  app.set('trust proxy', config.trustProxy);
  app.use(securityHeaders(config));
  if (config.logRequests) {
    app.use((req, res, next) => {
      const t0 = process.hrtime.bigint();
      res.on('finish', () => {
        const ms = Number(process.hrtime.bigint() - t0) / 1e6;
        log(`${new Date().toISOString()} ${req.method} ${req.originalUrl} ${res.statusCode} ${ms.toFixed(1)} ms`);
      });
      next();
    });
  }
  // Before compression and body parsing: a client over its sign-in limit costs as little as possible.
  app.post('/api/auth/login', addressLimiter(db, config));
  app.use(compression());
  app.use(cookieParser());
  app.use('/api', express.json({ limit: config.jsonLimit }));

  const pp = configurePassport(db, config);
  const api = express.Router();

  // who: anyone
  api.get('/health', (_req, res) => {
    db.get(sql`select 1`);
    res.json({ status: 'ok', version: PRODUCT_VERSION, solverVersion: SOLVER_VERSION, database: 'ok' });
  });
  api.use('/auth', authRouter(db, config, pp));
  api.use('/invitations', invitationRouter(db, config, pp, mailer)); // token routes need no session
  api.use(authenticate(pp), requireCsrf, requirePasswordChanged);
  api.use('/projects', projectRouter(db));
  api.use('/projects/:projectId/decks', projectDecksRouter(db, config));
  api.use('/decks', deckRouter(db, config));
  api.use('/decks', versionJobsRouter(db, pool));
  api.use('/decks', versionFactorsRouter(db, pool));
  api.use('/jobs', jobRouter(db, pool));
  api.use('/admin/users', userRouter(db, config, mailer));
  api.use('/mail', mailRouter(db));
  api.use('/projects/:projectId/attachments', projectAttachmentsRouter(db, filesDir));
  api.use('/attachments', attachmentRouter(db, filesDir));
  api.use('/reviews', reviewRouter(db, config, mailer, pool));
  api.use('/training', trainingRouter(db, config, mailer));
  api.use('/imports', importRouter(db, config));
  api.use('/projects/:projectId/studies', projectStudiesRouter(db, studiesRunner));
  api.use('/studies', studyRouter(db, studiesRunner));
  api.use('/reports', reportRouter(db, pool, packages));
  api.use(notFoundHandler);
  app.use('/api', api);

  const dist = resolve(config.clientDist);
  if (existsSync(resolve(dist, 'index.html'))) {
    app.use(
      express.static(dist, {
        index: false,
        maxAge: '1h',
        setHeaders(res, path) {
          if (/[\\/]assets[\\/][^\\/]+-[\w-]{8}\.\w+$/.test(path)) res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
        },
      }),
    );
    app.get('/{*splat}', (_req, res) => res.sendFile(resolve(dist, 'index.html'), { headers: { 'Cache-Control': 'no-cache' } }));
  }
  app.use(errorHandler(log));
  return app;
}
