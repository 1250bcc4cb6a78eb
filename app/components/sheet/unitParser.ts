// The unit reader (mathjs) is the largest library on the page and is needed only once someone
// types into a quantity field: it is fetched then (the field's first focus), not with the sheet.
import { useCallback, useState } from "react";

type Units = typeof import("#app/lib/units.ts");
export type ParseQuantity = Units["parseQuantity"];

let loaded: Units | undefined;
let loading: Promise<Units> | undefined;

export function loadUnitParser(): Promise<Units> {
  loading ??= import("#app/lib/units.ts").then((units) => (loaded = units));
  return loading;
}

/**
 * The reader once it is here (undefined before), and `want`, which fetches it: call it when a
 * field is first used. `whenReady` runs a step now if the reader is here, or once it arrives.
 */
export function useUnitParser(): { parse: ParseQuantity | undefined; want: () => void; whenReady: (step: (parse: ParseQuantity) => void) => void } {
  const [parse, setParse] = useState<ParseQuantity | undefined>(() => loaded?.parseQuantity);
  const whenReady = useCallback((step: (parse: ParseQuantity) => void) => {
    if (loaded) return step(loaded.parseQuantity);
    void loadUnitParser().then((units) => {
      setParse(() => units.parseQuantity);
      step(units.parseQuantity);
    });
  }, []);
  const want = useCallback(() => whenReady(() => {}), [whenReady]);
  return { parse: parse ?? loaded?.parseQuantity, want, whenReady };
}
