import type { Metadata } from "next";
import "./globals.css";
import { inter, mono } from "./fonts";
import { Providers } from "@/components/providers";

export const metadata: Metadata = {
  title: { default: "Kitwright", template: "%s · Kitwright" },
  description: "Measure, sort and audit drum sample libraries and pad layouts.",
};

export default function RootLayout({ children }: { children: React.ReactNode }) {
  return (
    <html lang="en" className={`${inter.variable} ${mono.variable}`}>
      <body className="min-h-screen font-sans">
        <Providers>{children}</Providers>
      </body>
    </html>
  );
}
