import { AsyncLocalStorage } from 'node:async_hooks';
import { ConsoleLogger, type LogLevel } from '@nestjs/common';

/** Ids that tie a log line to what it is about: one API request, or one queued job. */
export interface LogFields {
  requestId?: string;
  jobId?: string;
  calculationId?: number;
}

const store = new AsyncLocalStorage<LogFields>();

/** Runs `fn` with these ids added to every log line written while it (and what it awaits) runs. */
export function withLogFields<T>(fields: LogFields, fn: () => T): T {
  return store.run({ ...store.getStore(), ...fields }, fn);
}

/** The ids in effect here (empty outside a request or job). */
export function currentLogFields(): LogFields {
  return store.getStore() ?? {};
}

/** `req=… job=… calc=…` for text logs; empty when no ids are in effect. */
export function formatLogFields(fields: LogFields): string {
  const parts = [
    fields.requestId ? `req=${fields.requestId}` : '',
    fields.jobId ? `job=${fields.jobId}` : '',
    fields.calculationId !== undefined ? `calc=${fields.calculationId}` : '',
  ].filter(Boolean);
  return parts.length > 0 ? `${parts.join(' ')} ` : '';
}

interface JsonLogOptions {
  context: string;
  logLevel: LogLevel;
  writeStreamType?: 'stdout' | 'stderr';
  errorStack?: unknown;
  params?: Record<string, unknown>;
  error?: Error;
}

interface JsonLogObject {
  [key: string]: unknown;
  level: LogLevel;
  pid: number;
  timestamp: number;
  message: unknown;
}

export type LogFormat = 'text' | 'json';

/** QG_LOG_FORMAT: `json` (one JSON object per line) or `text` (the default). */
export function logFormatFromEnv(env: NodeJS.ProcessEnv = process.env): LogFormat {
  const v = env.QG_LOG_FORMAT;
  if (v === undefined || v === '' || v === 'text') return 'text';
  if (v === 'json') return 'json';
  throw new Error(`QG_LOG_FORMAT must be "text" or "json", not "${v}"`);
}

/**
 * Nest's console logger with the request and job ids of the current context in every line: as
 * fields (`requestId`, `jobId`, `calculationId`) in JSON lines, as `req=… job=… calc=…` in text.
 */
export class ContextLogger extends ConsoleLogger {
  constructor(processName: string, format: LogFormat, levels: LogLevel[]) {
    super({ json: format === 'json', prefix: processName, logLevels: levels });
  }

  protected override getJsonLogObject(message: unknown, options: JsonLogOptions): JsonLogObject {
    return { ...super.getJsonLogObject(message, options), ...currentLogFields() };
  }

  protected override formatContext(context: string): string {
    return super.formatContext(context) + formatLogFields(currentLogFields());
  }
}
