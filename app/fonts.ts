// Fonts shipped in the repo (woff2 copied from the fontsource packages), loaded with next/font/local.
import localFont from "next/font/local";

export const inter = localFont({ src: "./fonts/inter-latin-wght.woff2", variable: "--font-inter", display: "swap", weight: "100 900" });
export const mono = localFont({ src: "./fonts/jetbrains-mono-latin-wght.woff2", variable: "--font-mono-jb", display: "swap", weight: "100 800" });
