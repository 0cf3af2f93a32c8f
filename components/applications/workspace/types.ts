import type { ApplicationView } from "@/lib/applications/view";

// The page's data as it arrives over JSON (dates become strings).
type Jsonify<T> = T extends Date
  ? string
  : T extends (infer U)[]
    ? Jsonify<U>[]
    : T extends object
      ? { [K in keyof T]: Jsonify<T[K]> }
      : T;

export type View = Jsonify<ApplicationView>;
export type CommentView = View["comments"][number];
export type DocumentView = View["documents"][number];
