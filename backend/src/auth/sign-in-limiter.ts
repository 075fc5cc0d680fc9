import { HttpException, HttpStatus, Inject, Injectable, type OnModuleDestroy } from '@nestjs/common';
import { Redis } from 'ioredis';
import { RateLimiterMemory, RateLimiterRedis, RateLimiterRes } from 'rate-limiter-flexible';
import { appConfig, redisConnection, type AppConfig } from '../config/configuration.js';

/** How long a sign-in address stays "known" for an account after it signed in there. */
const KNOWN_ADDRESS_SECONDS = 30 * 24 * 3600;
/** Account failures are remembered this long; the hold after them grows from 30 s to 15 min. */
const ACCOUNT_WINDOW_SECONDS = 15 * 60;
const FIRST_HOLD_SECONDS = 30;
const MAX_HOLD_SECONDS = 15 * 60;

function tooMany(message: string, msBeforeNext: number): HttpException {
  const seconds = Math.max(1, Math.ceil(msBeforeNext / 1000));
  return new HttpException(
    { statusCode: 429, message: `${message}; try again in ${seconds} s`, retryAfterSeconds: seconds },
    HttpStatus.TOO_MANY_REQUESTS,
  );
}

/**
 * Sign-in guessing limits, kept in Redis so every API process shares them (in memory while Redis
 * is away). Four counters, after OWASP's authentication guidance:
 *  - attempts per address and e-mail (a typing user's limit);
 *  - failures per address (one password tried across many e-mails);
 *  - failures per account (guessing from many addresses): after a few, the account is held with a
 *    growing wait — but not for addresses it signed in from before, so its owner is not locked out;
 *  - failures across the whole shop (a spray from many addresses): unknown addresses wait.
 * The client address is the socket's unless TRUST_PROXY names the proxy (Express `trust proxy`).
 */
@Injectable()
export class SignInLimiter implements OnModuleDestroy {
  private readonly redis: Redis;
  private readonly perAddressEmail: RateLimiterRedis;
  private readonly addressFailures: RateLimiterRedis;
  private readonly accountFailures: RateLimiterRedis;
  private readonly shopFailures: RateLimiterRedis;

  constructor(@Inject(appConfig.KEY) private readonly config: AppConfig) {
    this.redis = new Redis({ ...redisConnection(config.redisUrl), enableOfflineQueue: false });
    this.redis.on('error', () => undefined); // the in-memory insurance limiters take over
    const make = (keyPrefix: string, points: number, duration: number) =>
      new RateLimiterRedis({
        storeClient: this.redis,
        keyPrefix: `qg:signin:${keyPrefix}`,
        points,
        duration,
        insuranceLimiter: new RateLimiterMemory({ points, duration }),
      });
    const windowSeconds = Math.max(1, Math.round(config.signInWindowMs / 1000));
    this.perAddressEmail = make('attempts', config.signInLimit, windowSeconds);
    this.addressFailures = make('address-fails', config.signInLimit * 3, ACCOUNT_WINDOW_SECONDS);
    this.accountFailures = make('account-fails', 10_000, ACCOUNT_WINDOW_SECONDS);
    this.shopFailures = make('shop-fails', config.signInGlobalFailures, windowSeconds);
  }

  onModuleDestroy(): void {
    this.redis.disconnect();
  }

  /** Before the password is checked: throws 429 (with the wait) when this attempt must not run. */
  async before(address: string, email: string): Promise<void> {
    try {
      await this.perAddressEmail.consume(`${address}|${email}`);
    } catch (res) {
      throw tooMany('Too many attempts for this e-mail from your address', msOf(res));
    }
    // An account's owner at an address it signed in from before is not held back by the guessing
    // of others; the per-address-and-e-mail limit above still applies to them.
    if (await this.isKnown(address, email)) return;
    const addressFails = await this.addressFailures.get(address);
    if (addressFails && addressFails.remainingPoints <= 0)
      throw tooMany('Too many failed sign-ins from your address', addressFails.msBeforeNext);
    const held = await this.accountFailures.get(`hold|${email}`);
    if (held && held.consumedPoints > 0)
      throw tooMany(
        'This account is held after repeated failed sign-ins (not for addresses it signed in from before)',
        held.msBeforeNext,
      );
    const shop = await this.shopFailures.get('all');
    if (shop && shop.remainingPoints <= 0)
      throw tooMany('Sign-in is slowed down after many failed attempts across the shop', shop.msBeforeNext);
  }

  async failed(address: string, email: string): Promise<void> {
    await Promise.all([
      this.addressFailures.penalty(address).catch(() => undefined),
      this.shopFailures.penalty('all').catch(() => undefined),
    ]);
    const fails = await this.accountFailures.penalty(email);
    const over = fails.consumedPoints - this.config.signInAccountFailures;
    if (over >= 0) {
      const hold = Math.min(MAX_HOLD_SECONDS, FIRST_HOLD_SECONDS * 2 ** over);
      await this.accountFailures.set(`hold|${email}`, 1, hold);
    }
  }

  async succeeded(address: string, email: string): Promise<void> {
    await Promise.all([
      this.accountFailures.delete(email),
      this.accountFailures.delete(`hold|${email}`),
      this.redis
        .multi()
        .sadd(`qg:signin:known|${email}`, address)
        .expire(`qg:signin:known|${email}`, KNOWN_ADDRESS_SECONDS)
        .exec()
        .catch(() => undefined),
    ]);
  }

  private async isKnown(address: string, email: string): Promise<boolean> {
    try {
      return (await this.redis.sismember(`qg:signin:known|${email}`, address)) === 1;
    } catch {
      return false;
    }
  }
}

function msOf(res: unknown): number {
  return res instanceof RateLimiterRes ? res.msBeforeNext : 60_000;
}
