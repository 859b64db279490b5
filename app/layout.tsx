import type { Metadata } from "next";
import { connection } from "next/server";
import { sans, mono } from "./fonts";
import "./globals.css";

export const metadata: Metadata = {
  title: { default: "Fanbound", template: "%s · Fanbound" },
  description: "Boolean equations minimized exactly and mapped onto a logic family within its fan-in and fan-out.",
};

export default async function RootLayout({ children }: { children: React.ReactNode }) {
  // Every page renders per request: Next puts the request's CSP nonce (proxy.ts) on its inline scripts.
  await connection();
  return (
    <html lang="en" className={`${sans.variable} ${mono.variable}`}>
      <body className="min-h-screen bg-paper font-sans text-base text-ink antialiased">{children}</body>
    </html>
  );
}
