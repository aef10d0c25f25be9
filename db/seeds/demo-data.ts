// The demo company for `npm start`. Every name here is invented. Tests never use this data.
import type { Role } from "../types";

export const DEMO_PASSWORD = "cure-and-casing-26";

export const DEMO_COMPANIES = [
  {
    name: "Quillmoor Provisions",
    timeZone: "Europe/London",
    currency: "GBP",
    kitchens: [
      { code: "YARD", name: "Quillmoor Yard", address: "4 Tanner's Row, Quillmoor", timeZone: null },
      { code: "LANE", name: "Saltmarsh Lane", address: "Unit 2, Saltmarsh Lane Trading Estate", timeZone: null },
      { code: "ROPE", name: "Old Ropewalk Deli", address: "17 Ropewalk, Eastharbour", timeZone: null },
    ],
    users: [
      { email: "admin@hankandlot.test", name: "Marit Oakes", role: "admin" as Role, kitchens: [] as string[] },
      { email: "manager@hankandlot.test", name: "Dalen Fisk", role: "manager" as Role, kitchens: [] },
      { email: "buyer@hankandlot.test", name: "Juno Harrow", role: "buyer" as Role, kitchens: [] },
      { email: "lead@hankandlot.test", name: "Oskar Pell", role: "kitchen_lead" as Role, kitchens: ["YARD"] },
      { email: "accountant@hankandlot.test", name: "Wren Callow", role: "accountant" as Role, kitchens: [] },
    ],
  },
  {
    name: "Ferngill Larder",
    timeZone: "America/Chicago",
    currency: "USD",
    kitchens: [{ code: "MAIN", name: "Ferngill Main Kitchen", address: "220 Mill Creek Road, Ferngill", timeZone: null }],
    users: [{ email: "other@hankandlot.test", name: "Ilse Marrow", role: "admin" as Role, kitchens: [] as string[] }],
  },
];
