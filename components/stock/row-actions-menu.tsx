"use client";

// The small menu behind a stock row's actions button: History, and for people who may post,
// Record waste / Record adjustment / Transfer out (the modes of the record sheet). One menu for the
// whole grid, drawn in a portal next to the button (grid cells clip their content). Keyboard: it
// opens on its first item (ArrowUp: the last), ArrowDown/ArrowUp move round, Home/End jump, a
// letter moves to the next item starting with it, Enter or Space chooses, Escape and Tab close; the
// owner puts focus back on the row's cell.
import { useCallback, useEffect, useLayoutEffect, useRef, useState, type ComponentType, type KeyboardEvent } from "react";
import { createPortal } from "react-dom";

export interface RowMenuItem {
  key: string;
  label: string;
  icon: ComponentType<{ className?: string; "aria-hidden"?: boolean }>;
  onSelect: () => void;
}

export interface RowMenuState {
  /** the grid row the menu belongs to */
  rowId: string;
  /** "Actions for SKU-1, lot A1": the menu's accessible name */
  label: string;
  /** where the button was when the menu opened (viewport coordinates) */
  anchor: { top: number; bottom: number; left: number; right: number };
  /** the item focused first */
  focus: "first" | "last";
  items: RowMenuItem[];
}

export function menuId(rowId: string): string {
  return `row-menu-${rowId.replace(/[^A-Za-z0-9_-]/g, "-")}`;
}

const MENU_WIDTH = 224;
const GAP = 4;

export function RowActionsMenu({ menu, onClose }: {
  menu: RowMenuState | null;
  /** "escape" and "tab" ask the owner to put focus back on the row; "outside" leaves it where it went */
  onClose: (reason: "escape" | "tab" | "outside" | "chosen") => void;
}) {
  const ref = useRef<HTMLDivElement>(null);
  const [position, setPosition] = useState<{ top: number; left: number } | null>(null);
  const itemRefs = useRef<(HTMLButtonElement | null)[]>([]);

  // placed under the button, right edges aligned; above it when there is no room below
  const place = useCallback((anchor: RowMenuState["anchor"], items: number) => {
    const height = ref.current?.offsetHeight || items * 44 + 12;
    const below = anchor.bottom + GAP;
    const top = below + height > window.innerHeight - 8 ? Math.max(8, anchor.top - GAP - height) : below;
    const left = Math.min(Math.max(8, anchor.right - MENU_WIDTH), window.innerWidth - MENU_WIDTH - 8);
    setPosition({ top, left });
  }, []);
  useLayoutEffect(() => {
    if (menu) place(menu.anchor, menu.items.length);
    else setPosition(null);
  }, [menu, place]);

  useEffect(() => {
    if (!menu || !position) return;
    const items = itemRefs.current.filter((b): b is HTMLButtonElement => !!b);
    (menu.focus === "last" ? items.at(-1) : items[0])?.focus();
  }, [menu, position]);

  useEffect(() => {
    if (!menu) return;
    // a press anywhere else closes it (the button that opened it toggles it itself)
    const onPointerDown = (e: PointerEvent) => {
      const target = e.target as Node | null;
      if (ref.current && target && !ref.current.contains(target)) {
        const trigger = (target as Element).closest?.("[data-row-menu-trigger]");
        if (trigger?.getAttribute("aria-controls") === menuId(menu.rowId)) return;
        onClose("outside");
      }
    };
    // the page or the grid scrolled (focusing a half-hidden row scrolls it into view): follow the
    // button, or close once its row is no longer drawn
    const onScroll = (e: Event) => {
      if (ref.current && e.target instanceof Node && ref.current.contains(e.target)) return;
      const trigger = document.querySelector(`[data-row-menu-trigger][aria-controls="${menuId(menu.rowId)}"]`);
      if (!trigger) {
        onClose("outside");
        return;
      }
      const r = trigger.getBoundingClientRect();
      const grid = trigger.closest(".ag-root-wrapper")?.getBoundingClientRect();
      if (grid && (r.bottom < grid.top || r.top > grid.bottom)) {
        onClose("outside");
        return;
      }
      place({ top: r.top, bottom: r.bottom, left: r.left, right: r.right }, menu.items.length);
    };
    document.addEventListener("pointerdown", onPointerDown, true);
    window.addEventListener("scroll", onScroll, true);
    window.addEventListener("resize", onScroll);
    return () => {
      document.removeEventListener("pointerdown", onPointerDown, true);
      window.removeEventListener("scroll", onScroll, true);
      window.removeEventListener("resize", onScroll);
    };
  }, [menu, onClose, place]);

  if (!menu || typeof document === "undefined") return null;

  const move = (e: KeyboardEvent<HTMLDivElement>) => {
    const items = itemRefs.current.filter((b): b is HTMLButtonElement => !!b);
    const at = items.findIndex((b) => b === document.activeElement);
    const go = (i: number) => items[(i + items.length) % items.length]?.focus();
    switch (e.key) {
      case "ArrowDown": go(at + 1); break;
      case "ArrowUp": go(at < 0 ? -1 : at - 1); break;
      case "Home": go(0); break;
      case "End": go(-1); break;
      case "Escape": onClose("escape"); break;
      case "Tab": onClose("tab"); break;
      default: {
        if (e.key.length !== 1 || e.ctrlKey || e.metaKey || e.altKey || !/\S/.test(e.key)) return;
        const letter = e.key.toLowerCase();
        for (let step = 1; step <= items.length; step++) {
          const i = (at + step) % items.length;
          if (items[i]?.textContent?.trim().toLowerCase().startsWith(letter)) {
            go(i);
            break;
          }
        }
      }
    }
    e.preventDefault();
    e.stopPropagation();
  };

  return createPortal(
    <div
      ref={ref}
      id={menuId(menu.rowId)}
      role="menu"
      aria-label={menu.label}
      aria-orientation="vertical"
      onKeyDown={move}
      style={{ position: "fixed", top: position?.top ?? -9999, left: position?.left ?? -9999, width: MENU_WIDTH, zIndex: 60 }}
      className="rounded-lg border border-salt-edge bg-white py-1.5 text-pepper shadow-xl"
    >
      {menu.items.map((item, i) => (
        <button
          key={item.key}
          ref={(el) => {
            itemRefs.current[i] = el;
          }}
          type="button"
          role="menuitem"
          tabIndex={-1}
          onClick={() => {
            onClose("chosen");
            item.onSelect();
          }}
          className="flex min-h-touch w-full items-center gap-3 px-4 text-left text-[15px] font-semibold text-pepper hover:bg-salt-deep focus:bg-paprika-soft focus:outline-none focus-visible:ring-2 focus-visible:ring-inset focus-visible:ring-paprika"
        >
          <item.icon aria-hidden className="h-[18px] w-[18px] shrink-0 text-brine" />
          {item.label}
        </button>
      ))}
    </div>,
    document.body,
  );
}
