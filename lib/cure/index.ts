// lib/cure: the cure calculator's arithmetic, limits and caution. Pure, no I/O, client-safe.
export { CURE_CAUTION } from "./caution";
export {
  calculateCure, CureInputError,
  type CureCalculation, type CureCalculationOptions, type CureCalculationRequest, type CureCheck, type CureLine, type MassAmount, type RequiredCure,
} from "./calculate";
export * from "./limits";
