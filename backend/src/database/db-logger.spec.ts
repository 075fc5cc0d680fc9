import { describe, expect, it } from 'vitest';
import { RedactingDbLogger } from './db-logger.js';

describe('RedactingDbLogger', () => {
  it('logs a failed query and its error but never its bound values', () => {
    const lines: string[] = [];
    const hash = '$2b$11$abcdefghijklmnopqrstuuM7j4rZ9x0QfS1WcHvm3GbpBq6Q6yK2';
    new RedactingDbLogger((l) => lines.push(l)).logQueryError(
      new Error('duplicate key value violates unique constraint "users_email_key"'),
      'INSERT INTO "users"("email", "password_hash") VALUES ($1, $2)',
      ['a@b.example', hash],
    );
    expect(lines).toHaveLength(1);
    expect(lines[0]).toContain('duplicate key value violates unique constraint');
    expect(lines[0]).toContain('INSERT INTO "users"');
    expect(lines[0]).toContain('2 bound values not logged');
    expect(lines[0]).not.toContain(hash);
    expect(lines[0]).not.toContain('a@b.example');
  });
});
