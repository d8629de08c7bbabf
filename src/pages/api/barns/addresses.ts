import { route } from '../../../lib/server/route.ts';
import { readParams } from '../../../lib/records/read.ts';
import { json } from '../../../lib/server/http.ts';
import { searchAddresses } from '../../../lib/records/addresses.ts';
import { addressQuery } from '../../../schemas/barns.ts';

/** Address look-up among the region's own address points (no outside geocoder); empty text finds nothing. */
export const GET = route('dispatcher', async (ctx) => {
  const { q } = readParams(ctx.url, addressQuery);
  return json({ addresses: searchAddresses(q) });
});
