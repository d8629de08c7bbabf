import { route } from '../../../lib/server/route.ts';
import { json } from '../../../lib/server/http.ts';
import { listUsers } from '../../../lib/db/users.ts';
import { db } from '../../../lib/server/db.ts';

/** GET → {users}: everyone who signs in to this practice. */
export const GET = route('lead', async (_ctx, user) => json({ users: await listUsers(db(), user.practiceId) }));
