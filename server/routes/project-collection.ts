import type { Request, Router } from 'express';
import type { z } from 'zod';
import type { Db } from '../db/client';
import { parseInput } from '../http/errors';
import { requireCoordinator, requireProjectMember, type ProjectAccess } from '../services/project-access';

/**
 * The five routes of a collection that belongs to a project, each a thin handler over its service:
 * - `GET    /projects/:projectId/<name>`: `list` (any member);
 * - `POST   /projects/:projectId/<name>`: `create` with the body parsed by its schema, 201 (coordinators);
 * - `GET    /projects/:projectId/<name>/:<idParam>`: `get` (any member);
 * - `PATCH  /projects/:projectId/<name>/:<idParam>`: `update` with the parsed body (coordinators);
 * - `DELETE /projects/:projectId/<name>/:<idParam>`: `remove`, 204 (coordinators).
 */
export interface ProjectCollection<C extends z.ZodType, P extends z.ZodType> {
  name: string;
  idParam: string;
  list(access: ProjectAccess): Promise<unknown>;
  get(access: ProjectAccess, id: string): Promise<unknown>;
  create: { body: C; run(access: ProjectAccess, input: z.infer<C>): Promise<unknown> };
  update: { body: P; run(access: ProjectAccess, id: string, patch: z.infer<P>): Promise<unknown> };
  remove(access: ProjectAccess, id: string): Promise<unknown>;
}

/** Adds the collection's five routes (see {@link ProjectCollection}) to `router`. */
export function addProjectCollection<C extends z.ZodType, P extends z.ZodType>(router: Router, db: Db, c: ProjectCollection<C, P>): void {
  const all = `/projects/:projectId/${c.name}`;
  const one = `${all}/:${c.idParam}`;
  // Named parameters without a wildcard are single strings (Express 5).
  const param = (req: Request, name: string) => String(req.params[name]);
  const project = (req: Request) => param(req, 'projectId');
  const id = (req: Request) => param(req, c.idParam);
  router.get(all, async (req, res) => {
    res.json(await c.list(await requireProjectMember(db, req, project(req))));
  });
  router.post(all, async (req, res) => {
    const access = await requireCoordinator(db, req, project(req));
    res.status(201).json(await c.create.run(access, parseInput(c.create.body, req.body)));
  });
  router.get(one, async (req, res) => {
    res.json(await c.get(await requireProjectMember(db, req, project(req)), id(req)));
  });
  router.patch(one, async (req, res) => {
    const access = await requireCoordinator(db, req, project(req));
    res.json(await c.update.run(access, id(req), parseInput(c.update.body, req.body)));
  });
  router.delete(one, async (req, res) => {
    await c.remove(await requireCoordinator(db, req, project(req)), id(req));
    res.status(204).end();
  });
}
