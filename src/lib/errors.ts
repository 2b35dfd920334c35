// Turns anything thrown into a sentence a baker can read.
import { ApiRequestError } from './api-client.ts';

export function getErrorMessage(error: unknown): string {
  if (error instanceof ApiRequestError) {
    if (error.body?.message) return error.body.message;
    if (error.status >= 500) return 'The server had a problem. Try again in a moment.';
    return `The server refused the request (${error.status}).`;
  }
  if (error instanceof TypeError && /fetch|network/i.test(error.message)) {
    return 'Could not reach the server. Check the network and try again.';
  }
  if (error instanceof Error && error.message) return error.message;
  if (typeof error === 'string' && error) return error;
  if (typeof error === 'object' && error !== null) {
    const e = error as { statusText?: unknown; data?: unknown; message?: unknown };
    if (typeof e.message === 'string' && e.message) return e.message;
    if (typeof e.data === 'string' && e.data) return e.data;
    if (typeof e.statusText === 'string' && e.statusText) return e.statusText;
  }
  return 'Something went wrong.';
}
