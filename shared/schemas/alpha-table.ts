import { z } from 'zod';
import { alphaTableSchema } from '../engine/schemas';

/** The project's alpha table (PUT body): the engine's schema, reused as is. */
export const AlphaTableInput = alphaTableSchema;
export type AlphaTableInput = z.infer<typeof AlphaTableInput>;
