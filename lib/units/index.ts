// lib/units: the only place quantities are converted. Pure, no I/O, client-safe.
// Scales: quantities NUMERIC(30,12) in the item's stock unit (g, m, ml, pc); unit costs
// NUMERIC(20,6) per stock unit; document money in integer minor units. Rounding is half-even and
// happens only where a value is stored (toStored*, unitCostPerStockUnit, minorUnits) or shown
// (formatQuantity); everything between is exact (Dec, 60 significant digits).
export {
  Dec,
  dec,
  isDecimalString,
  plain,
  toStored,
  toStoredQuantity,
  toStoredUnitCost,
  QUANTITY_PRECISION,
  QUANTITY_SCALE,
  UNIT_COST_PRECISION,
  UNIT_COST_SCALE,
  ZERO,
  ONE,
} from "./decimal";
export { UnitError, isUnitError, type UnitErrorCode } from "./errors";
export {
  BASE_UNIT,
  DIMENSION_OF_BASE,
  GLOBAL_UNITS,
  convert,
  factorOf,
  findGlobalUnit,
  getGlobalUnit,
  globalUnitsOf,
  normaliseUnitName,
  type BaseUnit,
  type Dimension,
  type GlobalUnit,
  type GlobalUnitCode,
} from "./global-units";
export {
  assertItemUnits,
  convertForItem,
  FROM_STOCK_DIGITS,
  fromStockUnits,
  isUnitFor,
  metresOf,
  putUpLabel,
  stockUnitsPer,
  toStockUnits,
  unitsFor,
  type ItemUnits,
  type Pack,
  type PutUp,
  type StockUnit,
  type UnitChoice,
} from "./item-units";
export {
  DISPLAY_DECIMALS,
  formatMetresOf,
  formatQuantity,
  type FormatOptions,
  type FormattedQuantity,
  type UnitSystem,
} from "./display";
export {
  CURRENCY_EXPONENTS,
  currencyExponent,
  fromMinorUnits,
  lineAmountMinor,
  minorUnits,
  unitCostPerStockUnit,
} from "./money";
