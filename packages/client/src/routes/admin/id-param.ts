import { data, type Params } from 'react-router-dom';

const uuidPattern = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** A mistyped address is a missing page, not a server round trip that fails validation. */
export function uuidParam(params: Params, name: string, what: string): string {
  const value = params[name];
  if (!value || !uuidPattern.test(value)) throw data(`That ${what} was not found`, { status: 404 });
  return value;
}
