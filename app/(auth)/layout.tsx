import { SHEET, outlinePath } from "@/components/connection-geometry";
import { GussetMark } from "@/components/gusset-mark";
import { SkipLink } from "@/components/ui/skip-link";

// Pages for people who are not signed in: sign-in, password reset, accepting an invitation.
export default function AuthLayout({ children }: { children: React.ReactNode }) {
  return (
    <div className="grid min-h-dvh lg:grid-cols-[minmax(0,5fr)_minmax(0,4fr)]">
      <SkipLink />
      <div className="flex flex-col px-6 py-8 sm:px-12">
        <div className="flex items-center gap-2.5 text-plate-700">
          <GussetMark className="h-8 w-8" />
          <span className="text-xl font-semibold tracking-tight text-ink-950">Gusset</span>
        </div>
        <main id="main" tabIndex={-1} className="flex flex-1 items-center justify-center py-10 focus:outline-none">
          <div className="w-full max-w-sm">{children}</div>
        </main>
        <p className="text-xs text-ink-500">The firm&apos;s library of calculation standards.</p>
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
        {/* column and beam, with their centre lines meeting at the work point */}
        <rect x="60" y="40" width="36" height="440" fill="#276f75" fillOpacity="0.35" />
        <rect x="96" y="330" width="290" height="32" fill="#276f75" fillOpacity="0.35" />
        {/* the gusset plate, its third side cut square to the brace */}
        <path d={outlinePath(SHEET.plate)} fill="#dcedeb" fillOpacity="0.9" />
        {/* the brace at 45°, lapping onto the plate; its centre line runs through the work point */}
        <path d={outlinePath(SHEET.brace)} fill="#31868c" fillOpacity="0.45" stroke="#123c40" strokeOpacity="0.5" />
        <path
          d={`M${SHEET.axis.workPoint.x} ${SHEET.axis.workPoint.y} L${SHEET.axis.far.x} ${SHEET.axis.far.y}`}
          stroke="#b9dcd9"
          strokeOpacity="0.5"
          strokeDasharray="14 4 2 4"
        />
        <g fill="#123c40">
          {SHEET.bolts.map((bolt) => (
            <circle key={`${bolt.x},${bolt.y}`} cx={bolt.x} cy={bolt.y} r={SHEET.boltRadius} />
          ))}
          {/* the plate's bolts to the column and to the beam, clear of the brace */}
          <circle cx="116" cy="190" r="5" />
          <circle cx="116" cy="225" r="5" />
          <circle cx="116" cy="260" r="5" />
          <circle cx="150" cy="312" r="5" />
          <circle cx="190" cy="312" r="5" />
          <circle cx="230" cy="312" r="5" />
        </g>
        {/* a dimension line, as on a detail */}
        <g stroke="#b9dcd9" strokeOpacity="0.6" fill="none">
          <path d="M96 410 H254 M96 402 V418 M254 402 V418" />
        </g>
        <text
          x="175"
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
