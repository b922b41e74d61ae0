import { GussetMark } from "@/components/gusset-mark";

// Pages for people who are not signed in: sign-in, password reset, accepting an invitation.
export default function AuthLayout({ children }: { children: React.ReactNode }) {
  return (
    <div className="grid min-h-dvh lg:grid-cols-[minmax(0,5fr)_minmax(0,4fr)]">
      <div className="flex flex-col px-6 py-8 sm:px-12">
        <div className="flex items-center gap-2.5 text-plate-700">
          <GussetMark className="h-8 w-8" />
          <span className="text-xl font-semibold tracking-tight text-ink-950">Gusset</span>
        </div>
        <main className="flex flex-1 items-center justify-center py-10">
          <div className="w-full max-w-sm">{children}</div>
        </main>
        <p className="text-xs text-ink-400">The firm&apos;s library of calculation standards.</p>
      </div>
      <AuthPanel />
    </div>
  );
}

// A quiet drawing of the idea: a bolted connection at a brace, set out like a detail on a sheet.
function AuthPanel() {
  return (
    <aside aria-hidden className="relative hidden overflow-hidden bg-plate-900 lg:block">
      <svg viewBox="0 0 400 520" className="absolute inset-0 h-full w-full" preserveAspectRatio="xMidYMid slice">
        <defs>
          <pattern id="grid" width="20" height="20" patternUnits="userSpaceOnUse">
            <path d="M20 0H0V20" fill="none" stroke="#ffffff" strokeOpacity="0.05" />
          </pattern>
        </defs>
        <rect width="400" height="520" fill="url(#grid)" />
        {/* column and beam */}
        <rect x="60" y="40" width="36" height="440" fill="#276f75" fillOpacity="0.35" />
        <rect x="96" y="330" width="290" height="32" fill="#276f75" fillOpacity="0.35" />
        {/* brace, coming in at 45° */}
        <path d="M190 236 L360 66 L384 90 L214 260 Z" fill="#31868c" fillOpacity="0.35" />
        {/* the gusset plate */}
        <path d="M96 170 H160 L280 290 V330 H96 Z" fill="#dcedeb" fillOpacity="0.9" />
        <g fill="#123c40">
          <circle cx="170" cy="222" r="6" />
          <circle cx="196" cy="248" r="6" />
          <circle cx="222" cy="274" r="6" />
          <circle cx="116" cy="200" r="5" />
          <circle cx="116" cy="240" r="5" />
          <circle cx="116" cy="280" r="5" />
          <circle cx="150" cy="312" r="5" />
          <circle cx="190" cy="312" r="5" />
          <circle cx="230" cy="312" r="5" />
        </g>
        {/* a dimension line, as on a detail */}
        <g stroke="#b9dcd9" strokeOpacity="0.6" fill="none">
          <path d="M96 410 H280 M96 402 V418 M280 402 V418" />
        </g>
        <text
          x="188"
          y="432"
          fill="#b9dcd9"
          fillOpacity="0.7"
          fontSize="11"
          textAnchor="middle"
          fontFamily="ui-monospace, monospace"
        >
          one standard, every job
        </text>
      </svg>
    </aside>
  );
}
