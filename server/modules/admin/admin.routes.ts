import { Router } from 'express';
import { createAdminSchema, userSearchSchema } from '../../../shared/schemas/admin';
import type { Database } from '../../db/client';
import { currentUser, requireRole } from '../../lib/auth/guards';
import { toMe } from '../users/users.repository';
import { createAdmin, searchUsers } from './admin.service';

export function adminRouter(deps: { db: Database; appUrl: string }) {
  const router = Router();
  router.use(requireRole('admin'));

  router.get('/users', async (req, res) => {
    const input = userSearchSchema.parse(req.query);
    res.json(await searchUsers(deps.db, input));
  });

  router.post('/admins', async (req, res) => {
    const input = createAdminSchema.parse(req.body);
    const user = await createAdmin(deps, input, currentUser(req).displayName);
    res.status(201).json({ user: toMe(user) });
  });

  return router;
}
