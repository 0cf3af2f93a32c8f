/** One reason a model file was refused, with the field it concerns (e.g. "members.B2.I"). */
export interface SolverInputIssue {
  path: string;
  message: string;
}

/**
 * The only error `solve` throws for a bad model. `message` is every issue as
 * "path: reason" on its own line, which is what the command line prints.
 */
export class SolverInputError extends Error {
  readonly issues: SolverInputIssue[];
  readonly path: string;

  constructor(issues: SolverInputIssue[]) {
    const list = issues.length > 0 ? issues : [{ path: "model", message: "is not valid" }];
    super(list.map((i) => `${i.path}: ${i.message}`).join("\n"));
    this.name = "SolverInputError";
    this.issues = list;
    this.path = list[0]?.path ?? "model";
  }
}

/** Collects issues while a stage of validation runs, then throws them together. */
export class IssueList {
  readonly items: SolverInputIssue[] = [];

  add(path: string, message: string): void {
    this.items.push({ path, message });
  }

  get empty(): boolean {
    return this.items.length === 0;
  }

  throwIfAny(): void {
    if (this.items.length > 0) throw new SolverInputError(this.items);
  }
}
