import { z } from 'zod';

// zod compiles object parsers with new Function() when it may; the content security policy forbids
// eval, and zod's probe for it would be reported as a violation on every page load.
z.config({ jitless: true });
