import { givenFields } from './given-fields';

describe('givenFields', () => {
  it('keeps what a request gave, including falsy values, and leaves out undefined and null', () => {
    const body = { name: '', position: 0, flag: false, description: null, targetDay: undefined };
    expect(givenFields(body)).toEqual({ name: '', position: 0, flag: false });
  });

  it('reads only the keys named', () => {
    const query = { role: 'analyst', state: undefined, page: 2, siteId: 'a' };
    expect(givenFields(query, ['role', 'state', 'siteId'])).toEqual({
      role: 'analyst',
      siteId: 'a',
    });
  });
});
