import { RequestMethod } from '@nestjs/common';
import { NestFactory } from '@nestjs/core';
import type { INestApplication } from '@nestjs/common';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { AppModule } from '../app.module';
import { DocumentBuilder, type OpenAPIObject, SwaggerModule } from '@nestjs/swagger';

/** Paths served outside the /api prefix (development pages, the offline verifier page). */
export const UNPREFIXED = [
  { path: 'dev/{*rest}', method: RequestMethod.ALL },
  { path: 'verify', method: RequestMethod.GET },
  { path: 'verify/download', method: RequestMethod.GET },
];

/** The API's OpenAPI document for an application whose routes are registered. */
export function createOpenApiDocument(app: INestApplication): OpenAPIObject {
  const info = new DocumentBuilder()
    .setTitle('Beadroll API')
    .setDescription('Provenance rolls for antique and vintage glass beads')
    .setVersion('1')
    .build();
  return SwaggerModule.createDocument(app, info);
}

/**
 * Builds the OpenAPI document from the module graph alone: Nest's preview mode resolves modules
 * and controllers without creating providers, so no database, mail or storage is touched.
 */
export async function buildOpenApiDocument(): Promise<OpenAPIObject> {
  const app = await NestFactory.create<NestExpressApplication>(AppModule, {
    preview: true,
    logger: false,
    abortOnError: false,
  });
  app.setGlobalPrefix('api', { exclude: UNPREFIXED });
  try {
    return createOpenApiDocument(app);
  } finally {
    await app.close().catch(() => undefined);
  }
}
