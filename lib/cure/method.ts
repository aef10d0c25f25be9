// The cure method a product class is made by (the inverse of CLASSES_BY_METHOD): a recipe names
// its class, and the class fixes how ingoing nitrite is calculated (FSIS Directive 7620.3 ch. 3).
import { CLASSES_BY_METHOD, METHODS, type CureMethod, type ProductClass } from "./limits";

export function methodOf(productClass: ProductClass): CureMethod {
  const method = METHODS.find((m) => CLASSES_BY_METHOD[m].includes(productClass));
  if (!method) throw new Error(`No cure method makes ${productClass}.`);
  return method;
}
