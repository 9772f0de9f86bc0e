/** An input that the fitness engine cannot turn into a number; the message names where it is. */
export class FitnessError extends Error {
  override name = 'FitnessError';
}
