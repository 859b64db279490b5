import type { Metadata } from "next";
import { sans, mono } from "./fonts";
import "./globals.css";

export const metadata: Metadata = {
  title: { default: "Fanbound", template: "%s · Fanbound" },
  description: "Boolean equations minimized exactly and mapped onto a logic family within its fan-in and fan-out.",
};

export default function RootLayout({ children }: { children: React.ReactNode }) {
  return (
    <html lang="en" className={`${sans.variable} ${mono.variable}`}>
      <body className="min-h-screen bg-paper font-sans text-base text-ink antialiased">{children}</body>
    </html>
  );
}
