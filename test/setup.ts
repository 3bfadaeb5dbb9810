// Property tests run from a fixed seed so CI is reproducible; set FC_SEED to explore other seeds.
import fc from 'fast-check';

fc.configureGlobal({ seed: Number(process.env['FC_SEED'] ?? 20261201) });
