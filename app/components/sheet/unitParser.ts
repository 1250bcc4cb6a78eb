// The unit reader (mathjs) loads after the sheet has appeared, not with it: it is the largest
// library on the page and is needed only once someone types into Details.
import { useEffect, useState } from "react";

type Units = typeof import("#app/lib/units.ts");

let loaded: Units | undefined;
let loading: Promise<Units> | undefined;

export function loadUnitParser(): Promise<Units> {
  loading ??= import("#app/lib/units.ts").then((units) => (loaded = units));
  return loading;
}

export function useUnitParser(): Units["parseQuantity"] | undefined {
  const [parse, setParse] = useState<Units["parseQuantity"] | undefined>(() => loaded?.parseQuantity);
  useEffect(() => {
    if (parse) return;
    let live = true;
    void loadUnitParser().then((units) => {
      if (live) setParse(() => units.parseQuantity);
    });
    return () => {
      live = false;
    };
  }, [parse]);
  return parse;
}
