import fs from 'node:fs';
import path from 'node:path';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { DocumentBuilder, SwaggerModule } from '@nestjs/swagger';
import cookieParser from 'cookie-parser';
import type { NextFunction, Request, Response } from 'express';
import helmet from 'helmet';
import { AllExceptionsFilter } from './common/http-exception.filter.js';
import { checkJsonDepth, csrfGuard, RequestHygienePipe } from './common/request-hygiene.js';
import { requestId } from './common/request-id.js';
import { appConfig, type AppConfig } from './config/configuration.js';

/**
 * Headers of every answer. The client is one origin with no inline script; MUI and Plotly set
 * inline styles; the PDF preview and the spectrum worker use blob: URLs. No page may frame it.
 */
const SECURITY_HEADERS = helmet({
  contentSecurityPolicy: {
    useDefaults: false,
    directives: {
      defaultSrc: ["'self'"],
      scriptSrc: ["'self'"],
      styleSrc: ["'self'", "'unsafe-inline'"],
      imgSrc: ["'self'", 'data:', 'blob:'],
      fontSrc: ["'self'", 'data:'],
      connectSrc: ["'self'"],
      workerSrc: ["'self'", 'blob:'],
      frameSrc: ["'self'", 'blob:'],
      objectSrc: ["'self'", 'blob:'],
      baseUri: ["'self'"],
      formAction: ["'self'"],
      frameAncestors: ["'none'"],
    },
  },
  crossOriginEmbedderPolicy: false,
  frameguard: { action: 'deny' },
  referrerPolicy: { policy: 'same-origin' },
});

/** Everything main.ts and the e2e tests configure alike: prefix, validation, errors, cookies, client. */
export function configureApp(app: NestExpressApplication, clientDist: string | null): void {
  const config = app.get<AppConfig>(appConfig.KEY);
  app.setGlobalPrefix('api');
  app.disable('x-powered-by');
  app.use(requestId);
  app.use(SECURITY_HEADERS);
  app.use(cookieParser());
  // Nest's option type leaves out body-parser's `verify`, which Express passes through unchanged.
  const jsonOptions: Record<string, unknown> = { limit: '2mb', verify: checkJsonDepth };
  app.useBodyParser('json', jsonOptions);
  // Forwarded client addresses are believed only from the proxy TRUST_PROXY names.
  app.set('trust proxy', config.trustProxy);
  app.use(csrfGuard);
  // Bodies and query strings are checked per route by the shared schemas (@ZodBody, @ZodQuery).
  app.useGlobalPipes(new RequestHygienePipe());
  app.useGlobalFilters(new AllExceptionsFilter());
  app.enableShutdownHooks();
  // OpenAPI description of every route, built on first request: /api/docs (pages), /api/docs-json.
  const description = new DocumentBuilder()
    .setTitle('Quietglass API')
    .setDescription(
      'Coating design, approval and production for thin-film shops. Sign in with POST /api/auth/sign-in.',
    )
    .setVersion('0.1')
    .addCookieAuth('qg_session')
    .build();
  SwaggerModule.setup('api/docs', app, () => SwaggerModule.createDocument(app, description), {
    jsonDocumentUrl: 'api/docs-json',
  });
  if (clientDist) serveClient(app, clientDist);
}

/** Serves the built client at / and its index.html for every non-API GET (client-side routes). */
function serveClient(app: NestExpressApplication, dir: string): void {
  const index = path.join(dir, 'index.html');
  if (!fs.existsSync(index)) throw new Error(`CLIENT_DIST ${dir} has no index.html; build the client first`);
  app.useStaticAssets(dir, { index: false, maxAge: '1h' });
  app.use((req: Request, res: Response, next: NextFunction) => {
    if (req.method !== 'GET' || req.path === '/api' || req.path.startsWith('/api/')) return next();
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(index);
  });
}
