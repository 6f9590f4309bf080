/**
 * Whether this browser has signed in and not signed out since. The refresh token is an
 * httpOnly cookie the client cannot see; without this hint every visit by someone signed out
 * would first ask the server and be refused. It holds no secret: a stale hint costs one
 * refused refresh.
 */
const KEY = 'gyre.signed-in';

export function rememberSession(): void {
  try {
    window.localStorage.setItem(KEY, '1');
  } catch {
    // Storage may be off (private mode); the client then always asks the server.
  }
}

export function forgetSession(): void {
  try {
    window.localStorage.removeItem(KEY);
  } catch {
    // See rememberSession.
  }
}

export function mightHaveSession(): boolean {
  try {
    return window.localStorage.getItem(KEY) !== null;
  } catch {
    return true;
  }
}
