import Link from "next/link";
import { Mark } from "./Mark";

/** The strip along the top of every page: the mark, where to go, who is signed in. */
export function SiteHeader({ children }: { children?: React.ReactNode }) {
  return (
    <header className="border-b border-rule bg-sheet">
      <div className="page-frame flex h-12 items-center gap-6">
        <Link prefetch={false} href="/" className="flex items-center gap-2 font-semibold text-ink">
          <span className="text-accent">
            <Mark />
          </span>
          Fanbound
        </Link>
        <nav className="flex items-center gap-4 text-sm text-graphite">
          <Link prefetch={false} href="/language" className="hover:text-ink">
            Language
          </Link>
        </nav>
        <div className="ml-auto flex items-center gap-3 text-sm">{children}</div>
      </div>
    </header>
  );
}
