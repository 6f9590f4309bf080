/**
 * The fields of a request's DTO that were given (neither undefined nor null): the filters of a
 * list query (`{ role, state }` of `?role=x&state=y`) or the changes of a PATCH body, which
 * leave every field it does not give as it was. `keys` limits it to those fields.
 */
export function givenFields<Source extends object, Key extends keyof Source = keyof Source>(
  source: Source,
  keys?: readonly Key[],
): Partial<Pick<Source, Key>> {
  const given: Partial<Pick<Source, Key>> = {};
  for (const key of keys ?? (Object.keys(source) as Key[])) {
    if (source[key] !== undefined && source[key] !== null) given[key] = source[key];
  }
  return given;
}
