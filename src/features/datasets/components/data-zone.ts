import { zoneStatement } from '../../../../shared/dates';

/** The sea-data pages' one zone statement: records are stored and shown in UTC (docs/domain.md#csv). */
export const DATA_ZONE_STATEMENT = zoneStatement('UTC', 'the time base of the stored sea data');
