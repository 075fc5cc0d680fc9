import type { Logger as TypeOrmLogger } from 'typeorm';

/**
 * Database log for the API and worker: failed queries and warnings, without the query's bound
 * values. Those values can be password hashes, session ids or customers' data, and a log is read
 * by more people than the database (OWASP logging guidance: no secrets or personal data in logs).
 */
export class RedactingDbLogger implements TypeOrmLogger {
  constructor(private readonly write: (line: string) => void = (line) => console.error(line)) {}

  logQuery(): void {}

  logQuerySlow(time: number, query: string): void {
    this.write(`[db] slow query (${time} ms): ${query}`);
  }

  logQueryError(error: string | Error, query: string, parameters?: unknown): void {
    const message = typeof error === 'string' ? error : error.message;
    const count = Array.isArray(parameters) ? parameters.length : 0;
    this.write(`[db] query failed: ${message}\n  query: ${query}\n  (${count} bound values not logged)`);
  }

  logSchemaBuild(): void {}

  logMigration(message: string): void {
    this.write(`[db] ${message}`);
  }

  log(level: 'log' | 'info' | 'warn', message: unknown): void {
    if (level === 'warn') this.write(`[db] warning: ${String(message)}`);
  }
}
