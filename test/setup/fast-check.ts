/**
 * Property tests run from a fixed seed so CI is reproducible; set FC_SEED to explore other seeds
 * locally (fast-check prints the seed and path of any counterexample it finds).
 */
import fc from "fast-check";

fc.configureGlobal({ seed: Number(process.env.FC_SEED ?? 20_261_202) });
