// Clean: a route module.
export const planRoute = '/plan';
