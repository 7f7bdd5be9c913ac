import type { Metadata, Viewport } from "next";
import { getLocale, getTranslations } from "next-intl/server";
import { bodyFont, codeFont, displayFont } from "@/components/fonts";
import "./globals.css";

export async function generateMetadata(): Promise<Metadata> {
  const t = await getTranslations("app");
  return { title: { default: t("name"), template: `%s · ${t("name")}` }, description: t("tagline"), icons: { icon: "/grainline-mark.svg" } };
}

export const viewport: Viewport = { themeColor: "#2f5d50", width: "device-width", initialScale: 1 };

export default async function RootLayout({ children }: { children: React.ReactNode }) {
  const locale = await getLocale();
  return (
    <html lang={locale} className={`${bodyFont.variable} ${displayFont.variable} ${codeFont.variable}`}>
      <body className="min-h-dvh antialiased">
        {children}
      </body>
    </html>
  );
}
