import { describe, expect, it } from 'vitest';
import { ApiRequestError, statusOf } from '../../../src/lib/api-client.ts';
import { getErrorMessage } from '../../../src/lib/errors.ts';

describe('getErrorMessage', () => {
  it.each([
    ['the server\'s own message', new ApiRequestError(404, { error: 'not_found', message: 'no formula "rye-x"' }, '/api/formulas/rye-x'), 'no formula "rye-x"'],
    ['a server failure without a body', new ApiRequestError(502, null, '/api/plans'), 'The server had a problem. Try again in a moment.'],
    ['a refusal without a body', new ApiRequestError(409, null, '/api/x'), 'The server refused the request (409).'],
    ['a network failure', new TypeError('Failed to fetch'), 'Could not reach the server. Check the network and try again.'],
    ['an Error', new Error('piece weight must be above 0 g; got 0 g'), 'piece weight must be above 0 g; got 0 g'],
    ['a string', 'flour too cold', 'flour too cold'],
    ['a route error response', { status: 403, statusText: 'Forbidden', data: null }, 'Forbidden'],
    ['nothing useful', 42, 'Something went wrong.'],
    ['null', null, 'Something went wrong.'],
  ])('reads %s', (_what, error, expected) => {
    expect(getErrorMessage(error)).toBe(expected);
  });
});

describe('statusOf', () => {
  it('finds the HTTP status of API and route errors, and null for others', () => {
    expect(statusOf(new ApiRequestError(401, null, '/api/me'))).toBe(401);
    expect(statusOf({ status: 403 })).toBe(403);
    expect(statusOf(new Error('x'))).toBeNull();
  });
});
