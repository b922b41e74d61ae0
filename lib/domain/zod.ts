// zod, set up once for every schema in lib/domain (they import `z` from here, not from "zod"). The schemas
// run in the browser too (the forms' resolvers), under a Content-Security-Policy without 'unsafe-eval':
// zod would compile object parsers with `new Function` and, to find out whether it may, try one; the
// browser refuses it and reports a CSP violation. jitless skips the probe and the compiling.
import { z } from "zod";

z.config({ jitless: true });

export { z };
