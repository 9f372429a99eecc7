/** The seed every randomised test uses; override with TEST_SEED=<integer>. Printed on failure by the tests that use it. */
export const TEST_SEED = Number.parseInt(process.env.TEST_SEED ?? '20261201', 10);
