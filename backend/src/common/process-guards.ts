import { Logger } from '@nestjs/common';

/**
 * Keeps a long-running process (API or worker) alive through stray promise rejections — logged,
 * never fatal — and, when started by `npm start`'s supervisor (QG_SUPERVISED=1), ends it when the
 * supervisor goes away: the supervisor holds the write end of our stdin, so end-of-file means it
 * has died, even by SIGKILL, and nothing is left running as an orphan.
 */
export function installProcessGuards(name: string, close: () => Promise<void>): void {
  const logger = new Logger(name);
  process.on('unhandledRejection', (reason: unknown) => {
    logger.error(
      `unhandled rejection (kept running): ${reason instanceof Error ? (reason.stack ?? reason.message) : String(reason)}`,
    );
  });
  if (process.env.QG_SUPERVISED !== '1') return;
  let leaving = false;
  const leave = () => {
    if (leaving) return;
    leaving = true;
    logger.warn('the supervisor has gone; stopping');
    setTimeout(() => process.exit(1), 5000).unref();
    close()
      .catch(() => undefined)
      .finally(() => process.exit(0));
  };
  process.stdin.on('end', leave);
  process.stdin.on('close', leave);
  process.stdin.on('error', leave);
  process.stdin.resume();
}
