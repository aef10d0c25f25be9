// The caution shown wherever cure is computed or stored (trade-facts §9): nitrite is toxic in
// overdose (symptoms from about 0.2-0.5 g of sodium nitrite, about 42 g of a 6.25 % cure is an
// estimated adult lethal dose), cure is kept labelled and apart, and the product's limits are
// planning defaults under local rules. The calculator page shows it and the API returns it.
export const CURE_CAUTION =
  "Curing salt is toxic in overdose. Keep it labelled and apart from salt and spices. Local regulation, your HACCP plan and licensed practice govern; the limits here are planning defaults.";
