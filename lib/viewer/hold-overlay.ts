// The hold-down method chosen on the program page, shared by the "Hold-down" section (which
// publishes every method's verdict per part) and the viewer's parts panel (which colours each
// part held or not held for the chosen method, with the reason). A tiny external store: no
// React here, so it is tested in node; components read it with useSyncExternalStore. One
// program page is open per browser tab, so one store serves it (holdOverlay).

export interface HoldVerdictView {
  held: boolean;
  reason: string;
}

export interface HoldOverlayMethod {
  method: string;
  label: string;
  /** by the analysis's part id */
  verdicts: ReadonlyMap<number, HoldVerdictView>;
}

export interface HoldOverlayState {
  /** the estimate the verdicts belong to; null: nothing published */
  estimateId: number | null;
  methods: readonly HoldOverlayMethod[];
  selected: string | null;
}

const EMPTY: HoldOverlayState = { estimateId: null, methods: [], selected: null };

export class HoldOverlayStore {
  private state: HoldOverlayState = EMPTY;
  private listeners = new Set<() => void>();

  subscribe = (fn: () => void): (() => void) => {
    this.listeners.add(fn);
    return () => {
      this.listeners.delete(fn);
    };
  };

  getSnapshot = (): HoldOverlayState => this.state;

  private set(next: HoldOverlayState) {
    this.state = next;
    for (const fn of this.listeners) fn();
  }

  /** the section's comparison; the selection is kept when the method is still there, else `selected` */
  publish(estimateId: number, methods: readonly HoldOverlayMethod[], selected: string | null): void {
    const keep = this.state.estimateId === estimateId && this.state.selected !== null && methods.some((m) => m.method === this.state.selected);
    const chosen = keep ? this.state.selected : selected !== null && methods.some((m) => m.method === selected) ? selected : (methods[0]?.method ?? null);
    this.set({ estimateId, methods, selected: chosen });
  }

  select(method: string): void {
    if (method === this.state.selected || !this.state.methods.some((m) => m.method === method)) return;
    this.set({ ...this.state, selected: method });
  }

  clear(): void {
    if (this.state !== EMPTY) this.set(EMPTY);
  }
}

/** the chosen method, or null when none is published */
export function selectedMethod(state: HoldOverlayState): HoldOverlayMethod | null {
  return state.methods.find((m) => m.method === state.selected) ?? null;
}

/** what the chosen method does to one part; null: no method chosen, or the part is not in the comparison */
export function verdictFor(state: HoldOverlayState, partId: number): HoldVerdictView | null {
  return selectedMethod(state)?.verdicts.get(partId) ?? null;
}

export const holdOverlay = new HoldOverlayStore();
