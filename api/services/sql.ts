/**
 * TypeORM's `query()` on PostgreSQL answers an UPDATE or DELETE with `[rows, affectedCount]`
 * but a SELECT or INSERT with the rows alone; this reads the rows of either.
 */
export function rowsOf<T>(result: unknown): T[] {
  if (Array.isArray(result) && result.length === 2 && Array.isArray(result[0]) && typeof result[1] === 'number') return result[0] as T[];
  return result as T[];
}
