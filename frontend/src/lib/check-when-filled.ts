import type { FormRule } from 'antd';

/**
 * A form rule that tests a filled-in value and passes while the field is empty (its `required`
 * rule says so). `test` may read other fields through `get` and returns the problem in words, or
 * null when the value is fine.
 */
export function checkWhenFilled<T, Field extends string = string>(
  test: (value: T, get: (name: Field) => unknown) => string | null,
): FormRule {
  return ({ getFieldValue }) => ({
    validator: async (_rule: unknown, value: T | null | undefined) => {
      if (value === null || value === undefined) return;
      const problem = test(value, getFieldValue as (name: Field) => unknown);
      if (problem !== null) throw new Error(problem);
    },
  });
}
