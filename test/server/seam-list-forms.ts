// What the seam-list tests send as the supervisor's browser would: url-encoded forms with the column mapping of
// the lists they upload, whose header names (a spreadsheet's, not the field names) are the same in every list.
import { ORIGIN, type TestServer } from './support.js';

/** The mapping of the fields every seam list must give. */
export const REQUIRED_MAPPING = {
  'map.id': 'Seam No',
  'map.label': 'Description',
  'map.jointType': 'Type',
  'map.t1': 'T1 (mm)',
  'map.length': 'Len',
  'map.material': 'Grade',
} as const;

/** A form posted as the signed-in supervisor, unless another account's cookie is given. */
export async function postForm(
  server: TestServer,
  path: string,
  fields: Record<string, string> | URLSearchParams,
  cookie?: string,
): Promise<Response> {
  return server.request(path, {
    method: 'POST',
    headers: {
      cookie: cookie ?? (await server.supervisorCookie()),
      origin: ORIGIN,
      'content-type': 'application/x-www-form-urlencoded',
    },
    body: new URLSearchParams(fields).toString(),
  });
}
