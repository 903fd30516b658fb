// Runs in the browser before the app's own code. zod compiles object parsers with `new Function` when it
// may; under the content security policy (no 'unsafe-eval', see proxy.ts) that probe is refused and
// reported as a violation. Parsing without it is the same, only a little slower, and reports nothing.
import { z } from 'zod';

z.config({ jitless: true });
