import type { FindOptionsWhere, ObjectLiteral } from 'typeorm';
import type { AppAbility, SubjectName } from '@gyre/shared';
import { scopedWhere } from '../../auth/access-scope';
import { containsText } from './text-filter';

/**
 * The `where` of a list in the caller's read scope: rows matching `filter` and, with a search
 * (`?q=`), containing its text in any one of its columns (`{ code: q, name: q }`), each OR
 * branch under the scope (`scopedWhere`).
 */
export function scopedSearchWhere<Row extends ObjectLiteral>(
  ability: AppAbility,
  subjectName: SubjectName,
  filter: FindOptionsWhere<Row>,
  search: Partial<Record<keyof Row & string, string>> | undefined,
): FindOptionsWhere<Row>[] {
  const branches =
    search === undefined
      ? [filter]
      : Object.entries(search).map(
          ([column, text]) =>
            ({ ...filter, [column]: containsText(text as string) }) as FindOptionsWhere<Row>,
        );
  return branches.flatMap((branch) => scopedWhere<Row>(ability, 'read', subjectName, branch));
}
