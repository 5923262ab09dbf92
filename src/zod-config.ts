/**
 * Imported first by main.tsx, before any module that builds a schema: zod 4 probes `new Function`
 * for its JIT when an object schema is constructed, and the page's Content-Security-Policy has no
 * 'unsafe-eval', so the probe would be reported as a violation. Parse without the JIT.
 */
import { z } from 'zod';

z.config({ jitless: true });
