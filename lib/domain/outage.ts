// What the proxy, the outage page and the API agree on while the database cannot be reached.

/** Where the proxy sends a page request (a rewrite: the address bar keeps the page asked for). */
export const OUTAGE_PAGE_PATH = "/unavailable";

/**
 * Set by the proxy on that rewrite, to the path that was asked for (for the page's "Try again"). The
 * proxy drops it from every incoming request, so only an outage shows the page; otherwise it is a 404.
 */
export const OUTAGE_REQUEST_HEADER = "x-gusset-outage";

/** Seconds a client or load balancer is asked to wait before trying again (Retry-After on every 503). */
export const RETRY_AFTER_SECONDS = 30;
