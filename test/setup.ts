/**
 * Runs before every test file: property tests draw from one fixed seed, so a
 * run in CI repeats exactly and a red run is reproducible. Set FC_SEED to
 * explore other draws locally; fast-check prints the seed of any failure.
 */
import fc from "fast-check";

fc.configureGlobal({ seed: Number(process.env.FC_SEED ?? 20261202) });
