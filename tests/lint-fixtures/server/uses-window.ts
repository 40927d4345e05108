// Bad: a browser global in server code.
export const here = (): string => window.location.href;
