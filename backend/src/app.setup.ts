import fs from 'node:fs';
import path from 'node:path';
import { ValidationPipe } from '@nestjs/common';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { DocumentBuilder, SwaggerModule } from '@nestjs/swagger';
import cookieParser from 'cookie-parser';
import type { NextFunction, Request, Response } from 'express';
import { AllExceptionsFilter } from './common/http-exception.filter.js';

/** Everything main.ts and the e2e tests configure alike: prefix, validation, errors, cookies, client. */
export function configureApp(app: NestExpressApplication, clientDist: string | null): void {
  app.setGlobalPrefix('api');
  app.use(cookieParser());
  app.useBodyParser('json', { limit: '2mb' });
  app.set('trust proxy', 'loopback');
  app.useGlobalPipes(new ValidationPipe({ whitelist: true, forbidNonWhitelisted: true, transform: true }));
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
