// Voltage classes by nominal voltage, following the IEC 60038 bands: low voltage up to 1 kV,
// medium voltage up to 35 kV, high voltage up to 230 kV, extra-high voltage above.
export type VoltageClass = "lv" | "mv" | "hv" | "ehv";

export function voltageClass(nominalKV: number): VoltageClass {
  if (nominalKV <= 1) return "lv";
  if (nominalKV <= 35) return "mv";
  if (nominalKV <= 230) return "hv";
  return "ehv";
}

export const VOLTAGE_CLASS_LABEL: Record<VoltageClass, string> = {
  lv: "LV",
  mv: "MV",
  hv: "HV",
  ehv: "EHV",
};
