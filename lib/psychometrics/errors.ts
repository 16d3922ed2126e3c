/**
 * Thrown for input the engine cannot fit (empty data, impossible counts, out-of-range
 * discounts or prices, unreachable targets). The message names the offending cell or row so
 * that import screens and the CLI can show it verbatim.
 */
export class PsychometricsInputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'PsychometricsInputError';
  }
}
