// Bad: a job reaches into a route instead of a service.
import { planRoute } from '../server/routes/plan';

export const job = (): string => planRoute;
