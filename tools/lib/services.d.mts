// Types of the helpers of services.mjs that TypeScript code (tests) imports.
export const ROOT: string;
export class StartupError extends Error {}
export function startPostgres(options: {
  dir: string;
  port: number;
  database: string;
  user?: string;
}): Promise<{ url: string; startedHere: boolean; resetDatabase(): void; stop(): void }>;
export function stopPostgresAt(dir: string): void;
