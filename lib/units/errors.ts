// The one error type of lib/units. Pure and client-safe, so it does not extend lib/http's AppError:
// the route wrapper maps a UnitError to a 422 with its code and message.

export type UnitErrorCode =
  | "INVALID_NUMBER" // not a plain decimal string (exponent, NaN, Infinity, a JS number...)
  | "UNKNOWN_UNIT" // neither a global unit nor this item's put-up or pack
  | "WRONG_DIMENSION" // a real unit that cannot convert to this item's stock unit
  | "PACK_CYCLE" // a pack whose size refers back to itself
  | "INVALID_ITEM" // an item's unit description contradicts itself
  | "UNKNOWN_CURRENCY"; // not in the table of ISO 4217 exponents

export class UnitError extends Error {
  constructor(
    readonly code: UnitErrorCode,
    message: string,
    readonly details?: Readonly<Record<string, string>>,
  ) {
    super(message);
    this.name = "UnitError";
  }
}

export function isUnitError(e: unknown): e is UnitError {
  return e instanceof UnitError;
}
