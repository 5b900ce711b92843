// The seed of the randomised tests (the hostile-input fuzz, the property tests): KERFBOOK_FUZZ_SEED
// when given, a fixed one in CI (CI=true) so that a red run there reproduces as it is, and a
// random one locally so that every run searches somewhere new. Printed, so any run can be replayed.
const FIXED_CI_SEED = 20261203

export function testSeed(what: string): number {
  const given = process.env.KERFBOOK_FUZZ_SEED
  const seed = given !== undefined && given !== ''
    ? Number(given)
    : process.env.CI === 'true' ? FIXED_CI_SEED : Math.floor(Math.random() * 2 ** 31)
  console.log(`[${what}] seed ${seed} (replay with KERFBOOK_FUZZ_SEED=${seed})`)
  return seed
}
