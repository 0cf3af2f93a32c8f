import type { Role } from "@/lib/workflow/roles";

export interface NavItem {
  href: string;
  label: string;
}

// Demo-only entries are added by the layout when DEMO_MODE is on.
export const NAV_BY_ROLE: Record<Role, NavItem[]> = {
  applicant: [
    { href: "/applications", label: "My applications" },
    { href: "/applications/new", label: "New application" },
    { href: "/invoices", label: "Invoices" },
  ],
  technician: [
    { href: "/intake", label: "Intake" },
    { href: "/applications", label: "All applications" },
    { href: "/invoices", label: "Invoices" },
  ],
  examiner: [
    { href: "/reviews", label: "My reviews" },
    { href: "/applications", label: "All applications" },
  ],
  supervisor: [
    { href: "/queue", label: "Queue" },
    { href: "/queue/workload", label: "Workload and turnaround" },
    { href: "/reviews", label: "My reviews" },
    { href: "/applications", label: "All applications" },
    { href: "/invoices", label: "Invoices" },
  ],
  admin: [
    { href: "/admin/users", label: "Users" },
    { href: "/admin/settings", label: "Review clock" },
    { href: "/admin/fees", label: "Fee schedule" },
  ],
};
