import type { NavIcon as NavIconName } from "./nav-items";

// Line icons drawn for Gusset on a 20-unit grid, 1.5 stroke, to sit beside 14 px labels.
const PATHS: Record<NavIconName, string> = {
  home: "M3 9.5 10 4l7 5.5V16a1 1 0 0 1-1 1h-3.5v-4.5h-5V17H4a1 1 0 0 1-1-1z",
  standards: "M4 3.5h3v13H4zM8.5 3.5h3v13h-3zM13 4.2l2.8-.7 2.4 12.6-2.8.7z",
  // an I section end-on: the firm's sections, materials and load-combination sets
  libraries: "M4.5 3.5h11v2.5h-4.25v8h4.25v2.5h-11V14h4.25V6H4.5z",
  jobs: "M3 6.5h14v9.5H3zM7 6.5V4h6v2.5M3 10.5h14",
  // a calc sheet with a "run" arrowhead on it: a standard put through its steps
  runs: "M4.5 2.5h8l3 3v12h-11zM12.5 2.5v3h3M8 8.5l4.5 3-4.5 3z",
  // a sheet struck through: a version taken out of use
  withdrawals: "M5 2.5h7l3.5 3.5v11.5H5zM12 2.5V6h3.5M3.5 16.5l13-13",
  audit: "M5 2.5h7l3.5 3.5v11.5H5zM8 9.5h5M8 12.5h5M8 15.5h3",
  // three hashes joined into one: the log's tree, sealed at its root
  integrity: "M10 3.5v4M10 7.5 5 12.5M10 7.5l5 5M3.5 12.5h3v3h-3zM13.5 12.5h3v3h-3zM8.5 2h3v3h-3z",
  people:
    "M7.5 9a2.75 2.75 0 1 0 0-5.5 2.75 2.75 0 0 0 0 5.5zM2.5 16.5c.5-3 2.5-4.5 5-4.5s4.5 1.5 5 4.5M13.5 4a2.5 2.5 0 0 1 0 5M15 12c1.5.5 2.3 2 2.5 4.5",
  mailbox: "M3 5h14v10H3zM3 5.5l7 5.5 7-5.5",
};

export function NavIcon({ name, className }: { name: NavIconName; className?: string }) {
  return (
    <svg
      viewBox="0 0 20 20"
      aria-hidden
      className={className}
      fill="none"
      stroke="currentColor"
      strokeWidth="1.5"
      strokeLinejoin="round"
      strokeLinecap="round"
    >
      <path d={PATHS[name]} />
    </svg>
  );
}
