// zod 4 probes once whether `new Function` may run, to compile fast object parsers. The probe is
// caught, but under the pages' Content-Security-Policy (no 'unsafe-eval', proxy.ts) the browser
// still reports it as a violation. In the browser zod runs without that compiler ("jitless", zod's
// documented switch for strict CSPs); the server keeps it.
import { z } from "zod";

if (typeof window !== "undefined") z.config({ jitless: true });
