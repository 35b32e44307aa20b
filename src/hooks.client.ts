// Runs once in the browser before any page code.
import { z } from 'zod';

// zod probes for `new Function` (to compile faster parsers) on its first parse; under the app's
// Content-Security-Policy (no 'unsafe-eval') the probe is refused and reported as a violation.
// jitless skips the probe; parsing a form's few fields needs no compiled parser.
z.config({ jitless: true });
