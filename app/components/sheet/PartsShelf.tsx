// The parts shelf: what can be placed on the sheet. Drag a part onto the sheet (onto a busbar to
// connect it at once), or press its button to place it in the middle of the view.
import type { DragEvent } from "react";
import { PART_DRAG_TYPE } from "./SheetCanvas.tsx";
import { partKinds, partNames, type PartKind } from "./sheetEdits.ts";
import { PartIcon } from "./symbols.tsx";

export function PartsShelf({ onPlace }: { onPlace(part: PartKind): void }) {
  const onDragStart = (event: DragEvent, part: PartKind) => {
    event.dataTransfer.setData(PART_DRAG_TYPE, part);
    event.dataTransfer.effectAllowed = "copy";
  };
  return (
    <nav className="ks-panel ks-shelf" aria-labelledby="ks-shelf-title">
      <header className="ks-panel-head">
        <h2 id="ks-shelf-title">Parts shelf</h2>
        <p className="ks-panel-sub">Drag onto the sheet, or press to place</p>
      </header>
      <ul className="ks-shelf-list">
        {partKinds.map((part, i) => (
          <li key={part}>
            <button
              type="button"
              className="ks-part"
              draggable
              onDragStart={(event) => onDragStart(event, part)}
              onClick={() => onPlace(part)}
              aria-keyshortcuts={String(i + 1)}
              title={`Place a ${partNames[part].toLowerCase()} (key ${i + 1})`}
            >
              <PartIcon part={part} />
              <span className="ks-part-name">{partNames[part]}</span>
              <kbd className="ks-part-key" aria-hidden="true">
                {i + 1}
              </kbd>
            </button>
          </li>
        ))}
      </ul>
      <p className="ks-panel-foot">Then drag from a part's terminal dot to a busbar to connect it.</p>
    </nav>
  );
}
