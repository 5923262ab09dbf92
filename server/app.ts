import fs from 'node:fs';
import path from 'node:path';
import express, { Router } from 'express';
import helmet from 'helmet';
import { toNodeHandler } from 'better-auth/node';
import type { AppDeps } from './context';
import { loadSession } from './auth/require-role';
import { clearSessionCacheAfterWrites } from './auth/session-cache';
import { apiNotFound, errorHandler } from './middleware/error-handler';
import { registerModules } from './modules';
import { clientAddressHeader } from './security/client-address';
import { signInRateLimit } from './security/rate-limit';

export type CreateAppOptions = {
  /** Folder of the built client (dist/client). When missing, `/` answers a short placeholder. */
  clientDir?: string;
};

/** Builds the Express app. It does not listen: server/index.ts does, and tests use supertest. */
export function createApp(deps: AppDeps, options: CreateAppOptions = {}): express.Express {
  const app = express();
  const https = deps.config.baseUrl.startsWith('https://');
  app.disable('x-powered-by');
  app.set('trust proxy', deps.config.trustProxy);
  app.use(
    helmet({
      // Everything is served from this origin; nothing is loaded from outside.
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          defaultSrc: ["'self'"],
          scriptSrc: ["'self'"],
          styleSrc: ["'self'", "'unsafe-inline'"],
          fontSrc: ["'self'", 'data:'],
          imgSrc: ["'self'", 'data:', 'blob:'],
          connectSrc: ["'self'"],
          workerSrc: ["'self'", 'blob:'],
          frameSrc: ["'self'", 'blob:'],
          objectSrc: ["'none'"],
          baseUri: ["'self'"],
          formAction: ["'self'"],
          frameAncestors: ["'self'"],
          ...(https ? { upgradeInsecureRequests: [] } : {}),
        },
      },
      strictTransportSecurity: https,
    }),
  );

  // The client's address as Express decides it (TRUST_PROXY), for better-auth too.
  app.use(clientAddressHeader());
  // Failed sign-ins are limited per address before better-auth sees them (server/security).
  app.post('/api/auth/sign-in/email', signInRateLimit(deps.config.signInRateLimit));
  // Sign-out, password and session changes: forget the remembered session look-ups.
  app.use('/api/auth', clearSessionCacheAfterWrites(deps.sessionCache));
  // better-auth reads the raw body itself: mount it before express.json().
  app.all('/api/auth/{*any}', toNodeHandler(deps.auth));

  const api = Router();
  api.use(express.json({ limit: '5mb' }));
  api.use(loadSession(deps.auth, deps.sessionCache, deps.clock));
  // Role changes, deactivation, password resets and set passwords end sessions: forget the
  // look-ups too (every users service call that revokes sessions is under these two paths).
  api.use(['/users', '/invitations'], clearSessionCacheAfterWrites(deps.sessionCache));
  registerModules(api, deps);
  api.use(apiNotFound);
  app.use('/api', api);

  serveClient(app, options.clientDir);
  app.use(errorHandler(deps.logger));
  return app;
}

function serveClient(app: express.Express, clientDir: string | undefined) {
  const index = clientDir ? path.join(clientDir, 'index.html') : null;
  if (clientDir && index && fs.existsSync(index)) {
    app.use(express.static(clientDir, { index: false, maxAge: '1h' }));
    // SPA fallback after the API: every other GET of a page gets the client, which routes
    // itself. A missing file (a path with an extension) is a plain 404, not index.html.
    app.get('/{*any}', (req, res) => {
      if (path.extname(req.path)) return res.status(404).type('text/plain').send('Not found\n');
      res.setHeader('Cache-Control', 'no-cache');
      res.sendFile(index);
    });
    return;
  }
  app.get('/{*any}', (_req, res) => {
    res
      .type('text/plain')
      .send('Emberline API is running. The web client has not been built: run `npm run build` (or `npm start`).\n');
  });
}
