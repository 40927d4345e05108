// Response shapes shared by the API and the client.
import type { GlobalRole, ProjectRole } from './auth/roles';

export interface ApiErrorBody {
  error: { code: string; message: string; details: unknown };
}

export interface MeResponse {
  id: string;
  name: string;
  email: string;
  globalRole: GlobalRole;
  /** Signed in with a temporary password: the app asks for a new one before anything else. */
  mustChangePassword: boolean;
  projects: { id: string; name: string; role: ProjectRole }[];
}

/** 'admin' appears for administrators looking at a project they are not a member of. */
export type ProjectAccessRole = ProjectRole | 'admin';

export interface ProjectSummary {
  id: string;
  name: string;
  role: ProjectAccessRole;
}

export interface ProjectDetail extends ProjectSummary {
  description: string;
  dataPointName: string;
  dataPointLatitude: number | null;
  dataPointLongitude: number | null;
  dataPointDepthM: number | null;
  forecastSource: 'service' | 'uploads';
  /** p of the calibrated alpha table (docs/domain.md#calibrated-alpha) */
  alphaCalibrationP: number;
  createdAt: string;
}

export interface AdminUser {
  id: string;
  name: string;
  email: string;
  globalRole: GlobalRole;
  active: boolean;
  createdAt: string;
  /** Still on a temporary password from an administrator. */
  mustChangePassword: boolean;
  /** When that temporary password stops working (ISO), or null. */
  temporaryPasswordExpiresAt: string | null;
  projects: { projectId: string; projectName: string; role: ProjectRole }[];
}
