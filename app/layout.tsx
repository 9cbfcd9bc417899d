import type { Metadata } from "next";
import { plexMono, plexSans } from "./fonts";
import "./globals.css";

export const metadata: Metadata = {
  title: { default: "Ohmstead", template: "%s · Ohmstead" },
  description: "Busbar, feeder, fault-withstand and enclosure-heat calculation sheets for panel builders, with review and stamped calculation packages.",
};

export default function RootLayout({ children }: { children: React.ReactNode }) {
  return (
    <html lang="en" className={`${plexSans.variable} ${plexMono.variable}`}>
      <body className="min-h-screen font-sans">{children}</body>
    </html>
  );
}
