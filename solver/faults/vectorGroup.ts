// IEC 60076-1 vector groups, read for what matters to a fault study: which windings let
// zero-sequence current reach their terminals. The clock number is kept for completeness; it
// shifts angles only, never a fault current magnitude at a single fault location.

export type WindingConnection = "star" | "delta" | "zigzag";

export interface Winding {
  connection: WindingConnection;
  /** The neutral is brought out and earthed (the N/n in YN, yn, ZN, zn). */
  neutralEarthed: boolean;
}

export interface VectorGroup {
  hv: Winding;
  lv: Winding;
  /** Phase displacement of LV behind HV in 30° steps. */
  clockNumber: number;
}

export class VectorGroupError extends Error {
  override name = "VectorGroupError";
}

const hvLetters: Record<string, Winding> = {
  YN: { connection: "star", neutralEarthed: true },
  Y: { connection: "star", neutralEarthed: false },
  D: { connection: "delta", neutralEarthed: false },
  ZN: { connection: "zigzag", neutralEarthed: true },
  Z: { connection: "zigzag", neutralEarthed: false },
};

const notation = /^(YN|Y|D|ZN|Z)(yn|y|d|zn|z)(\d{1,2})$/;

/**
 * Parse IEC 60076-1 notation: HV letters in capitals, LV letters in small letters, then the
 * clock number 0–11 (YNd11, Dyn11, YNyn0, Yzn11, ZNyn11 …). Anything else is refused with a
 * message that says what was expected.
 */
export function parseVectorGroup(code: string): VectorGroup {
  const match = notation.exec(code);
  if (!match)
    throw new VectorGroupError(
      `vector group "${code}" is not IEC 60076-1 notation: expected HV letters YN, Y, D, ZN or Z, ` +
        `then LV letters yn, y, d, zn or z, then a clock number 0 to 11 (for example YNd11, Dyn11, YNyn0)`,
    );
  const clockNumber = Number(match[3]);
  if (clockNumber > 11)
    throw new VectorGroupError(`vector group "${code}": clock number ${clockNumber} must be 0 to 11`);
  const hv = hvLetters[match[1]];
  const lv = hvLetters[match[2].toUpperCase()];
  // Star against delta or zigzag shifts by an odd number of 30° steps; like windings, and delta
  // against zigzag, by an even number. Another clock number cannot be wound.
  const mixed = hv.connection !== lv.connection && (hv.connection === "star" || lv.connection === "star");
  if ((clockNumber % 2 === 1) !== mixed)
    throw new VectorGroupError(
      `vector group "${code}" cannot be wound: a ${hv.connection} HV with a ${lv.connection} LV needs an ${mixed ? "odd" : "even"} clock number`,
    );
  return { hv: { ...hv }, lv: { ...lv }, clockNumber };
}

/**
 * How one transformer appears in the zero-sequence network.
 *
 * - "series": both sides are earthed stars (YNyn): zero-sequence current passes through the
 *   transformer's zero-sequence impedance from one side to the other.
 * - "shunt": the side's winding drives zero-sequence current to earth through the transformer's
 *   zero-sequence impedance, without any coupling to the other side:
 *   an earthed star against a delta (the delta closes the current inside the transformer), or an
 *   earthed zigzag whatever the other winding is (the two halves of each zigzag phase sit on
 *   different limbs in opposite sense, so zero-sequence ampere-turns cancel on every limb: the
 *   zigzag is a low-impedance earthing path on its own side and neither sends zero-sequence
 *   current to the other winding nor receives any from it).
 * - "open": no zero-sequence current flows in or out on that side (unearthed star, delta seen
 *   from its own terminals, an earthed star whose partner winding cannot balance its
 *   ampere-turns; magnetising branches are left out, so a core's own zero-sequence path is too).
 */
export type ZeroSequenceCoupling =
  | { kind: "series" }
  | { kind: "shunt"; side: "hv" | "lv" }
  | { kind: "shunt-both" }
  | { kind: "open" };

const earthedStar = (w: Winding) => w.connection === "star" && w.neutralEarthed;
const earthedZigzag = (w: Winding) => w.connection === "zigzag" && w.neutralEarthed;

export function zeroSequenceCoupling(group: VectorGroup): ZeroSequenceCoupling {
  const { hv, lv } = group;
  if (earthedStar(hv) && earthedStar(lv)) return { kind: "series" };
  if (earthedZigzag(hv) && earthedZigzag(lv)) return { kind: "shunt-both" };
  if (earthedZigzag(hv)) return { kind: "shunt", side: "hv" };
  if (earthedZigzag(lv)) return { kind: "shunt", side: "lv" };
  if (earthedStar(hv) && lv.connection === "delta") return { kind: "shunt", side: "hv" };
  if (earthedStar(lv) && hv.connection === "delta") return { kind: "shunt", side: "lv" };
  return { kind: "open" };
}
