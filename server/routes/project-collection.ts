import type { Request, Response, Router } from 'express';
import type { z } from 'zod';
import type { Db } from '../db/client';
import type { SessionUser } from '../http/context';
import { parseInput } from '../http/errors';
import { requireCoordinator, requireProjectMember, type ProjectAccess } from '../services/project-access';

/** A request to a route whose named parameters have no wildcard: each is a single string (Express 5). */
export type ProjectRequest = Request<Record<string, string>>;

const param = (req: Request, name: string) => String(req.params[name]);

/** Who may call a project's route: any member (or an administrator), or coordinators (and administrators). */
export type ProjectRouteRole = 'member' | 'coordinator';

/** What a project's route answers, from the caller's access to the project (checked before). */
export type ProjectAnswer = (access: ProjectAccess, req: ProjectRequest, res: Response) => Promise<unknown>;

/**
 * Adds thin routes under `/projects/:projectId/` to `router`: `get(path, role, answer)` checks the
 * caller's role in the project, then answers 200 with what `answer` returns (as JSON); `create` is
 * a POST answered 201, `remove` a DELETE answered 204 without a body.
 */
export function projectRoutes(router: Router, db: Db) {
  const guard = { member: requireProjectMember, coordinator: requireCoordinator };
  const route =
    (method: 'get' | 'post' | 'put' | 'patch' | 'delete', status: 200 | 201 | 204 = 200) =>
    (path: string, role: ProjectRouteRole, answer: ProjectAnswer) => {
      router[method](`/projects/:projectId/${path}`, async (req, res) => {
        const body = await answer(await guard[role](db, req, param(req, 'projectId')), req as ProjectRequest, res);
        if (status === 204) res.status(204).end();
        else res.status(status).json(body);
      });
    };
  return {
    get: route('get'),
    post: route('post'),
    put: route('put'),
    patch: route('patch'),
    delete: route('delete'),
    create: route('post', 201),
    remove: route('delete', 204),
  };
}

/** What a collection's routes call; the handlers of {@link ProjectCollection}. */
export interface CollectionHandlers<C extends z.ZodType, P extends z.ZodType> {
  list(access: ProjectAccess): Promise<unknown>;
  get(access: ProjectAccess, id: string): Promise<unknown>;
  create(access: ProjectAccess, input: z.infer<C>): Promise<unknown>;
  update(access: ProjectAccess, id: string, patch: z.infer<P>): Promise<unknown>;
  remove(access: ProjectAccess, id: string): Promise<unknown>;
}

/**
 * The five routes of a collection that belongs to a project (its path `<name>/:<idParam>`), each a
 * thin handler over its service:
 * - `GET    /projects/:projectId/<name>`: `list` (any member);
 * - `POST   /projects/:projectId/<name>`: `create` with the body parsed by `body.create`, 201 (coordinators);
 * - `GET    /projects/:projectId/<name>/:<idParam>`: `get` (any member);
 * - `PATCH  /projects/:projectId/<name>/:<idParam>`: `update` with the body parsed by `body.update` (coordinators);
 * - `DELETE /projects/:projectId/<name>/:<idParam>`: `remove`, 204 (coordinators).
 */
export interface ProjectCollection<C extends z.ZodType, P extends z.ZodType> extends CollectionHandlers<C, P> {
  body: { create: C; update: P };
}

/**
 * The handlers of an audited collection whose service functions take `(db, projectId, ...)`, the
 * writes with the user after the project (as worksites and operations do).
 */
export function auditedService<C extends z.ZodType, P extends z.ZodType>(
  db: Db,
  service: {
    list(db: Db, projectId: string): Promise<unknown>;
    get(db: Db, projectId: string, id: string): Promise<unknown>;
    create(db: Db, projectId: string, user: SessionUser, input: z.infer<C>): Promise<unknown>;
    update(db: Db, projectId: string, user: SessionUser, id: string, patch: z.infer<P>): Promise<unknown>;
    remove(db: Db, projectId: string, user: SessionUser, id: string): Promise<unknown>;
  },
): CollectionHandlers<C, P> {
  return {
    list: (a) => service.list(db, a.projectId),
    get: (a, id) => service.get(db, a.projectId, id),
    create: (a, input) => service.create(db, a.projectId, a.user, input),
    update: (a, id, patch) => service.update(db, a.projectId, a.user, id, patch),
    remove: (a, id) => service.remove(db, a.projectId, a.user, id),
  };
}

/** Adds the collection's five routes (see {@link ProjectCollection}) to `router`. */
export function addProjectCollection<C extends z.ZodType, P extends z.ZodType>(
  router: Router,
  db: Db,
  one: `${string}/:${string}`,
  c: ProjectCollection<C, P>,
): void {
  const [all, idParam] = one.split('/:');
  const id = (req: ProjectRequest) => req.params[idParam];
  const routes = projectRoutes(router, db);
  routes.get(all, 'member', (a) => c.list(a));
  routes.create(all, 'coordinator', (a, req) => c.create(a, parseInput(c.body.create, req.body)));
  routes.get(one, 'member', (a, req) => c.get(a, id(req)));
  routes.patch(one, 'coordinator', (a, req) => c.update(a, id(req), parseInput(c.body.update, req.body)));
  routes.remove(one, 'coordinator', (a, req) => c.remove(a, id(req)));
}
