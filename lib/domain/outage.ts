// What the API and its callers agree on while the database cannot be reached.

/** Seconds a client or load balancer is asked to wait before trying again (Retry-After on every 503). */
export const RETRY_AFTER_SECONDS = 30;
