import type { FormRule } from 'antd';

/**
 * The rules of a written reason in Review's forms (a flag, a blinded decision, the visit's own
 * choices): required, and once something is typed at least `minLength` characters, saying
 * how many there are so far.
 */
export function reasonRules(minLength: number): FormRule[] {
  return [
    { required: true, whitespace: true, message: 'A reason is required.' },
    {
      validator: async (_rule, value: string | undefined) => {
        const length = (value ?? '').trim().length;
        if (length > 0 && length < minLength) {
          throw new Error(`Write at least ${minLength} characters (${length} so far).`);
        }
      },
    },
  ];
}
