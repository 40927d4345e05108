// Makes the migrated empty embedded database that a first start copies (server/db/template.ts);
// `npm run build` runs it. Nothing to do when the current one exists.
import { ensureDatabaseTemplate } from '../server/db/template';

const dir = await ensureDatabaseTemplate((m) => console.log(`[lullwatch] ${m}`));
console.log(`[lullwatch] empty database template: ${dir}`);
