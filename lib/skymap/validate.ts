import { SkymapError } from "./errors";

/** Departure of the total from 1 beyond which normalising earns a warning (the 1e-3). */
export const NORMALISATION_TOLERANCE = 1e-3;

/** Refuses NaN, infinite and negative values, naming the column and how many. */
export function checkProbabilities(values: Float64Array, name: string): void {
  let nan = 0;
  let infinite = 0;
  let negative = 0;
  let min = 0;
  for (let i = 0; i < values.length; i++) {
    const v = values[i] ?? 0;
    if (v >= 0) continue;
    if (Number.isNaN(v)) nan++;
    else if (v === -Infinity) infinite++;
    else {
      negative++;
      if (v < min) min = v;
    }
  }
  for (let i = 0; i < values.length; i++) if (values[i] === Infinity) infinite++;
  if (nan > 0) throw new SkymapError("non-finite", `column ${name} has ${nan} NaN values`);
  if (infinite > 0) throw new SkymapError("non-finite", `column ${name} has ${infinite} infinite values`);
  if (negative > 0) {
    throw new SkymapError("negative", `negative probabilities: column ${name} has ${negative} values below 0 (lowest ${min})`);
  }
}

/** Divides by the total in place; warns when the total was not 1 within NORMALISATION_TOLERANCE. */
export function normalise(values: Float64Array, warnings: string[], ...companions: Float64Array[]) {
  let total = 0;
  for (let i = 0; i < values.length; i++) total += values[i] ?? 0;
  if (!(total > 0)) throw new SkymapError("zero-total", "probabilities sum to zero");
  const normalised = Math.abs(total - 1) > NORMALISATION_TOLERANCE;
  if (normalised) warnings.push(`total probability ${total.toPrecision(6)} differs from 1; normalised`);
  for (const array of [values, ...companions]) {
    for (let i = 0; i < array.length; i++) array[i] = (array[i] ?? 0) / total;
  }
  return { total, normalised };
}
