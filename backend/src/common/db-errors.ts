/** PostgreSQL's unique_violation (SQLSTATE 23505). */
export function isUniqueViolation(err: unknown): boolean {
  return (err as { code?: unknown }).code === '23505';
}
