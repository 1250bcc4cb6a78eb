// The sentence a planner reads when a network cannot carry its load: which loads, fed through
// which chain of branches from which source, and how far beyond the limit the load is.
import type { Network } from "#solver/schema.ts";
import type { IdIndex } from "#solver/idIndex.ts";

export interface CollapseFacts {
  /** Bus voltages at the largest load share that still solved. */
  busVoltagePu: Float64Array;
  busIsPq: (bus: number) => boolean;
  groupSlack: Int32Array;
  /** Share of the load (percent) that still solved. */
  loadabilityPct: number;
  /** Iterations spent on the full load before it was refused, and how they ended. */
  iterations: number;
  failure?: "iterations" | "diverged" | "singular" | "limits";
}

/** What the iterations did, in words: they ran out, ran away, found no direction, or kept switching. */
export function failureWords(failure: CollapseFacts["failure"], iterations: number): string {
  const after = `after ${iterations} iteration${iterations === 1 ? "" : "s"}`;
  switch (failure) {
    case "diverged":
      return `ran away (its mismatch grew without bound) ${after}`;
    case "singular":
      return `found no direction to improve in (a singular Jacobian) ${after}`;
    case "limits":
      return `was still switching sources between their set points and reactive limits ${after}`;
    default:
      return `did not settle in ${iterations} iterations`;
  }
}

const NAMED_LOADS = 3;
const NAMED_BRANCHES = 6;

export function describeCollapse(network: Network, busIndex: IdIndex, facts: CollapseFacts): string {
  const n = network.buses.length;
  let weakest = -1;
  for (let i = 0; i < n; i++) {
    if (facts.busIsPq(i) && (weakest < 0 || facts.busVoltagePu[i] < facts.busVoltagePu[weakest])) weakest = i;
  }
  const pct = Math.round(facts.loadabilityPct);
  if (weakest < 0 || facts.groupSlack[weakest] < 0) {
    return `The load flow ${failureWords(facts.failure, facts.iterations)}; with every load scaled down it solves up to about ${pct} % of its load.`;
  }
  const slackBus = facts.groupSlack[weakest];
  const tree = spanningTree(network, busIndex, slackBus);
  const chainBuses: number[] = [];
  const chainBranches: string[] = [];
  for (let bus = weakest; bus !== slackBus && tree.parentBus[bus] >= 0; bus = tree.parentBus[bus]) {
    chainBuses.unshift(bus);
    chainBranches.unshift(tree.parentBranchName[bus]);
  }
  // The loads fed through the first branch of the chain: everything downstream of its far end.
  const downstream = new Uint8Array(n);
  if (chainBuses.length > 0) {
    downstream[chainBuses[0]] = 1;
    for (const bus of tree.visitOrder) if (tree.parentBus[bus] >= 0 && downstream[tree.parentBus[bus]]) downstream[bus] = 1;
  }
  let fed = network.loads.filter((l) => downstream[busIndex.get(l.bus)!] && l.pMW > 0);
  if (fed.length === 0) fed = network.loads.filter((l) => facts.groupSlack[busIndex.get(l.bus)!] === slackBus && l.pMW > 0);
  fed.sort((a, b) => Math.hypot(b.pMW, b.qMvar) - Math.hypot(a.pMW, a.qMvar));
  const totalMW = fed.reduce((sum, l) => sum + l.pMW, 0);
  const named = fed.slice(0, NAMED_LOADS).map((l) => `${l.name} (${formatMW(l.pMW)} MW)`);
  const others = fed.length - named.length;
  const loadsText = others > 0 ? `${named.join(", ")} and ${others} other load${others > 1 ? "s" : ""}` : joinWords(named);
  const totalText = fed.length > 1 ? `, ${formatMW(totalMW)} MW in all` : "";
  const slackSource = network.sources.find((s) => s.control === "slack" && busIndex.get(s.bus) === slackBus);
  const sourceText = slackSource ? slackSource.name : network.buses[slackBus].name;
  const chainText = describeChain(chainBranches);
  const weakBus = network.buses[weakest];
  const voltage = facts.busVoltagePu[weakest].toFixed(2);

  if (pct >= 99) {
    return (
      `The load flow ${failureWords(facts.failure, facts.iterations)}: the chain from ${sourceText} through ${chainText} ` +
      `is at the edge of what it can deliver to ${loadsText}${totalText} (it still solves with about ${pct} % of its load, ` +
      `${weakBus.name} then at ${voltage} pu).`
    );
  }
  const beyond = pct > 0 ? `about ${Math.round((100 / pct - 1) * 100)} % beyond its limit` : "far beyond its limit";
  return (
    `The network cannot carry its load: the chain from ${sourceText} through ${chainText} cannot deliver ` +
    `${loadsText}${totalText}. It could carry about ${pct} % of its load (the load is ${beyond}); ` +
    `at that point ${weakBus.name} is down to ${voltage} pu. At full load the load flow ${failureWords(facts.failure, facts.iterations)}.`
  );
}

interface SpanningTree {
  parentBus: Int32Array;
  parentBranchName: string[];
  visitOrder: number[];
}

/** Breadth-first tree of the slack's group over lines and transformers: the shortest chain to each bus. */
function spanningTree(network: Network, busIndex: IdIndex, root: number): SpanningTree {
  const n = network.buses.length;
  const adjacency: { bus: number; name: string }[][] = Array.from({ length: n }, () => []);
  const connect = (a: string, b: string, name: string) => {
    const i = busIndex.get(a)!;
    const j = busIndex.get(b)!;
    adjacency[i].push({ bus: j, name });
    adjacency[j].push({ bus: i, name });
  };
  for (const l of network.lines) connect(l.fromBus, l.toBus, l.name);
  for (const t of network.transformers) connect(t.hvBus, t.lvBus, t.name);
  const parentBus = new Int32Array(n).fill(-1);
  const parentBranchName: string[] = new Array(n).fill("");
  const seen = new Uint8Array(n);
  const visitOrder = [root];
  seen[root] = 1;
  for (let head = 0; head < visitOrder.length; head++) {
    const i = visitOrder[head];
    for (const edge of adjacency[i]) {
      if (seen[edge.bus]) continue;
      seen[edge.bus] = 1;
      parentBus[edge.bus] = i;
      parentBranchName[edge.bus] = edge.name;
      visitOrder.push(edge.bus);
    }
  }
  return { parentBus, parentBranchName, visitOrder };
}

function describeChain(names: string[]): string {
  if (names.length === 0) return "its own bus";
  if (names.length <= NAMED_BRANCHES) return joinWords(names);
  const head = names.slice(0, 3).join(", ");
  const tail = names.slice(-2).join(" and ");
  return `${head}, … ${tail} (${names.length} branches in all)`;
}

function joinWords(words: string[]): string {
  if (words.length <= 1) return words.join("");
  return `${words.slice(0, -1).join(", ")} and ${words[words.length - 1]}`;
}

function formatMW(mw: number): string {
  return mw >= 10 ? mw.toFixed(0) : mw >= 1 ? mw.toFixed(1) : mw.toFixed(2);
}
