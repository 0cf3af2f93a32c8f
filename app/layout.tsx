import type { Metadata } from "next";
import type { ReactNode } from "react";
import { mono, sans } from "@/fonts";
import "./globals.css";

export const metadata: Metadata = {
  title: { default: "Spanproof", template: "%s · Spanproof" },
  description: "Plan review for the Building Safety Division: applications, sheets, correction comments and deflection checks.",
};

export default function RootLayout({ children }: { children: ReactNode }) {
  return (
    <html lang="en" className={`${sans.variable} ${mono.variable}`}>
      <body className="min-h-screen antialiased">{children}</body>
    </html>
  );
}
