// Why a sheet's document cannot be saved or solved, in the planner's words and tied to the
// element concerned, so Checks can select it and Details can show the message by its field.
import { validateNetwork, type Network } from "#solver/schema.ts";
import { terminalBus, terminalField, terminalsOf, type TerminalId } from "./flowModel.ts";
import { COLLECTION_OF_KIND, describeElement, indexElements, type AnyElement, type ElementKind } from "#app/lib/networkElements.ts";

export interface SheetIssue {
  /** The element concerned, when there is one. */
  elementId?: string;
  /** The field of that element, when the issue is about one field. */
  field?: string;
  message: string;
}

const terminalWords: Record<TerminalId, string> = {
  t: "its terminal",
  hv: "its HV terminal",
  lv: "its LV terminal",
  from: "its from-end",
  to: "its to-end",
};

const kindByCollection = Object.fromEntries(Object.entries(COLLECTION_OF_KIND).map(([kind, key]) => [key, kind])) as Record<
  string,
  ElementKind
>;

/** Every reason the document is not a valid network file yet; empty when it is. */
export function documentIssues(doc: Network): SheetIssue[] {
  const issues: SheetIssue[] = [];
  const loose = new Set<string>();
  for (const [id, entry] of indexElements(doc)) {
    if (entry.kind === "bus") continue;
    for (const terminal of terminalsOf(entry.kind)) {
      if (terminalBus(entry, terminal) !== "") continue;
      loose.add(`${id}.${terminalField[terminal]}`);
      issues.push({
        elementId: id,
        field: terminalField[terminal],
        message: `${describeElement(entry)}: connect ${terminalWords[terminal]} to a busbar`,
      });
    }
  }
  const validated = validateNetwork(doc);
  if (validated.ok) return issues;
  for (const issue of validated.issues) {
    const match = /^(\w+)\[(\d+)\](?:\.(\w+))?/.exec(issue.path);
    const kind = match ? kindByCollection[match[1]] : undefined;
    const element = kind ? (doc[COLLECTION_OF_KIND[kind]] as AnyElement[])[Number(match![2])] : undefined;
    if (element && match![3] && loose.has(`${element.id}.${match![3]}`)) continue;
    const field = match?.[3];
    // The cross-element rules already name their element; shape errors name only a path.
    const named = !element || issue.message.includes(element.id);
    issues.push({
      elementId: element?.id,
      field,
      message: named ? issue.message : `${element.name}: ${field ? `${field} ` : ""}${issue.message}`,
    });
  }
  return issues;
}
