import localFont from "next/font/local";

// Shipped with the app (app/fonts/*.woff2, SIL Open Font License); nothing is fetched at build.
export const sans = localFont({ src: "./fonts/inter-variable.woff2", variable: "--font-sans", display: "swap", weight: "100 900" });
export const mono = localFont({ src: "./fonts/geist-mono-variable.woff2", variable: "--font-mono", display: "swap", weight: "100 900" });
