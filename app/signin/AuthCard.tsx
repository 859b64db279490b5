import { SiteHeader } from "@/components/ui/SiteHeader";

/** The sheet that sign-in, sign-up, reset and invitation pages sit on. */
export function AuthCard({ title, subtitle, children }: { title: string; subtitle?: string; children: React.ReactNode }) {
  return (
    <>
      <SiteHeader />
      <main className="sheet-grid flex min-h-[calc(100vh-3rem)] items-start justify-center px-4 py-16">
        <div className="w-full max-w-sm rounded border border-rule bg-sheet p-6 shadow-sm">
          <h1 className="text-xl font-semibold">{title}</h1>
          {subtitle && <p className="mt-1 text-sm text-graphite">{subtitle}</p>}
          {children}
        </div>
      </main>
    </>
  );
}

/**
 * Only paths on this site are followed after a sign-in: one leading slash, and
 * no backslash or control character anywhere (browsers read "/\host" as
 * "//host", another site).
 */
export function safeCallback(url: string | undefined, fallback = "/workspaces"): string {
  // eslint-disable-next-line no-control-regex
  return url && url.startsWith("/") && !url.startsWith("//") && !/[\\\u0000-\u001f]/.test(url) ? url : fallback;
}
