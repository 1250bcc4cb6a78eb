// The minimum short-circuit current of IEC 60909-0: the weakest infeed, the lower voltage factor
// and conductors hot at the end of the fault, with no motor or converter contribution. Grid
// connections are judged on it (protection must still see a fault; a converter needs a strong
// enough network, its short-circuit ratio).

/** Above this nominal voltage the network counts as high voltage for the voltage factor. */
const LOW_VOLTAGE_LIMIT_KV = 1;

/** Voltage factor c_min: 1.00 above 1 kV, 0.95 at or below 1 kV (IEC 60909-0, table of c). */
export function voltageFactorCMin(nominalKV: number): number {
  return nominalKV > LOW_VOLTAGE_LIMIT_KV ? 1.0 : 0.95;
}

/** Conductor temperature at the end of the fault when an element does not say (common practice for planning). */
export const END_OF_FAULT_TEMPERATURE_C = 80;

/** Temperature coefficient of resistance used by IEC 60909-0 for copper and aluminium, per kelvin. */
const RESISTANCE_TEMPERATURE_COEFFICIENT = 0.004;

/** R_L = [1 + 0.004 K⁻¹·(θe − 20 °C)]·R_L20: the factor on a line's 20 °C resistance. */
export function endOfFaultResistanceFactor(temperatureC = END_OF_FAULT_TEMPERATURE_C): number {
  return 1 + RESISTANCE_TEMPERATURE_COEFFICIENT * (temperatureC - 20);
}

/** Short-circuit ratio at a converter's bus: S"k3min over the plant's rated power. */
export function shortCircuitRatio(minimumFaultMVA: number, ratedMVA: number): number {
  return minimumFaultMVA / ratedMVA;
}
