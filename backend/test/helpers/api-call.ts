import request from 'supertest';
import type { UserKey } from './seed';
import type { TestApp } from './test-app';

/**
 * One API call as a seeded user, signed in through the API: `data` is a POST's JSON body,
 * else the query. The response.
 */
async function callAs(
  t: TestApp,
  user: UserKey,
  method: 'get' | 'post' | 'delete',
  path: string,
  data: object,
): Promise<request.Response> {
  const call = request(t.url)
    [method](path)
    .set(await t.authHeader(user));
  return method === 'post' ? call.send(data) : call.query(data);
}

/** `GET path` (with `query`) as a seeded user. */
export const getAs = (t: TestApp, user: UserKey, path: string, query: object = {}) =>
  callAs(t, user, 'get', path, query);

/** `POST path` with a JSON `body` as a seeded user. */
export const postAs = (t: TestApp, user: UserKey, path: string, body: object = {}) =>
  callAs(t, user, 'post', path, body);

/** `DELETE path` as a seeded user. */
export const deleteAs = (t: TestApp, user: UserKey, path: string) =>
  callAs(t, user, 'delete', path, {});

/** `POST /api/users/invitations` as a seeded user: `name` <`email`> invited in `role`. */
export const inviteAs = (
  t: TestApp,
  user: UserKey,
  email: string,
  name: string,
  role: string,
  membership: { studyId?: string; siteId?: string } = {},
) => postAs(t, user, '/api/users/invitations', { email, name, role, ...membership });
