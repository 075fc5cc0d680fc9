import { BadRequestException, NotFoundException } from '@nestjs/common';

/**
 * A record that a request names in its body (not in its path) and that does not exist is a bad
 * request: 400 with `message` as its detail. Any other failure (e.g. the database being away)
 * passes through unchanged.
 */
export async function missingAsBadRequest<T>(lookup: Promise<T>, message: string): Promise<T> {
  try {
    return await lookup;
  } catch (err) {
    if (err instanceof NotFoundException) throw new BadRequestException({ message: [message] });
    throw err;
  }
}

/** The record, or null when it does not exist; any other failure passes through. */
export async function orNull<T>(lookup: Promise<T>): Promise<T | null> {
  try {
    return await lookup;
  } catch (err) {
    if (err instanceof NotFoundException) return null;
    throw err;
  }
}
