import type { Metadata, Viewport } from "next";
import "./globals.css";
import { inter, mono } from "./fonts";
import { Providers } from "@/components/providers";
import { themeScript } from "@/components/ui/theme-script";

export const metadata: Metadata = {
  title: { default: "Kitwright", template: "%s · Kitwright" },
  description: "Measure, sort and audit drum sample libraries and pad layouts.",
};

export const viewport: Viewport = {
  width: "device-width",
  initialScale: 1,
  themeColor: [
    { media: "(prefers-color-scheme: light)", color: "#f5f3ee" },
    { media: "(prefers-color-scheme: dark)", color: "#17191c" },
  ],
};

export default function RootLayout({ children }: { children: React.ReactNode }) {
  return (
    // data-theme is set by themeScript before the first paint, so the server's markup differs from the client's
    <html lang="en" className={`${inter.variable} ${mono.variable}`} suppressHydrationWarning>
      <head>
        <script dangerouslySetInnerHTML={{ __html: themeScript }} />
      </head>
      <body className="min-h-screen font-sans">
        <Providers>{children}</Providers>
      </body>
    </html>
  );
}
