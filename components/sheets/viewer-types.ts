// The viewer's contract with the pages that embed it. Re-exported from sheet-viewer.tsx.

/** url: GET returns the PDF bytes (same origin, cookie auth). */
export interface ViewerDocument {
  id: number;
  name: string;
  url: string;
  pageCount: number;
  cycle: number;
}

/** page: 1-based page of the document. */
export interface ViewerSheet {
  id: number;
  documentId: number;
  page: number;
  sheetNumber: string | null;
  title: string;
  cycle: number;
}

export type PinStatus = "draft" | "open" | "resolved";

/** x, y: fraction of the displayed page, 0..1 from top-left. */
export interface ViewerPin {
  id: number;
  number: number;
  sheetId: number;
  x: number;
  y: number;
  status: PinStatus;
  summary?: string;
}

export interface SheetViewerProps {
  documents: ViewerDocument[];
  /** Every sheet of every cycle; the viewer shows the current set (latest version of each sheet) by default. */
  sheets: ViewerSheet[];
  pins: ViewerPin[];
  /** Examiner in review: a "Place comment pin" mode; a click on the sheet calls onPlacePin. */
  canPlacePins?: boolean;
  onPlacePin?: (p: { sheetId: number; x: number; y: number }) => void;
  selectedPinId?: number | null;
  onSelectPin?: (pinId: number) => void;
  initialSheetId?: number;
  /** Called whenever the sheet on screen changes (e.g. to filter a comment list). */
  onSheetChange?: (sheetId: number) => void;
  /** Sizing of the viewer box; defaults to a tall panel. */
  className?: string;
}
