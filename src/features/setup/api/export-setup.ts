/**
 * `GET /api/projects/:projectId/export`: the setup document as a JSON attachment. Opened as a plain
 * link (the session cookie goes along), so the browser saves it under the server's file name.
 */
export const exportSetupUrl = (projectId: string) => `/api/projects/${projectId}/export`;
