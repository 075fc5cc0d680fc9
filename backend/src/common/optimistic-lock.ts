import type { EntityManager, EntityTarget, ObjectLiteral, QueryDeepPartialEntity } from 'typeorm';
import { elementAt } from '@quietglass/shared/checked';

/** A change to one row that only applies while the row is still at the version the editor read. */
export interface LockedChange<T extends ObjectLiteral> {
  id: number;
  /** The version (row version) the editor started from. */
  expectedVersion: number;
  set: QueryDeepPartialEntity<T>;
  /** Further conditions checked by the same statement, e.g. `status = :status`. */
  where?: string;
  params?: ObjectLiteral;
}

/**
 * Optimistic locking in one statement: `UPDATE … SET …, version = version + 1 WHERE id = $1 AND
 * version = $2 [AND …] RETURNING version`. PostgreSQL re-checks the WHERE clause on the newest row
 * after waiting for a concurrent writer, so of two edits started from the same version exactly one
 * wins; the other affects no row and gets the error `conflict()` builds (usually a 409 that says who
 * changed what). Returns the new version. Every editable record saves through this; there is no
 * separate check-then-save anywhere, except on user accounts, whose edit compares the version while
 * it holds the row lock that the last-admin rule takes anyway.
 */
export async function updateIfVersion<T extends ObjectLiteral>(
  manager: EntityManager,
  target: EntityTarget<T>,
  change: LockedChange<T>,
  conflict: () => Promise<Error> | Error,
): Promise<number> {
  const metadata = manager.connection.getMetadata(target);
  const versionColumn =
    metadata.versionColumn ??
    metadata.columns.find((c) => c.propertyName === 'rowVersion' || c.propertyName === 'version');
  if (!versionColumn) throw new Error(`${metadata.name} has no version column to lock on`);
  const column = versionColumn.databaseName;
  const result = await manager
    .createQueryBuilder()
    .update(target)
    .set({
      ...change.set,
      [versionColumn.propertyName]: () => `"${column}" + 1`,
    })
    .where(
      `id = :lockedId AND "${column}" = :expectedVersion${change.where ? ` AND (${change.where})` : ''}`,
      {
        ...change.params,
        lockedId: change.id,
        expectedVersion: change.expectedVersion,
      },
    )
    .returning(`"${column}"`)
    .execute();
  if (result.affected !== 1) throw await conflict();
  const rows = result.raw as Record<string, number>[];
  return Number(elementAt(rows, 0, 'the updated rows')[column]);
}
