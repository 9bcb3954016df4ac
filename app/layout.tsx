import type { Metadata } from "next";
import type { ReactNode } from "react";
import { sans, mono } from "./fonts";
import "./globals.css";

export const metadata: Metadata = {
  title: { default: "Tareline", template: "%s · Tareline" },
  description: "Designed-experiment planning and review for reaction optimisation.",
};

export default function RootLayout({ children }: { children: ReactNode }) {
  return (
    <html lang="en" className={`${sans.variable} ${mono.variable}`}>
      <body className="min-h-screen">{children}</body>
    </html>
  );
}
