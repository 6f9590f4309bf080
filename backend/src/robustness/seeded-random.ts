/**
 * The fuzzer's and the crash test's names for the signal core's one seeded generator
 * (signal/random/random.ts): a seed and a case number name one input exactly, so a failure
 * seen once can be replayed alone, on any machine.
 */
export { mixSeed as caseSeed, SeededRandom as Rng } from '../signal/random/random';
