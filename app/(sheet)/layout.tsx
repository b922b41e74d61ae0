// Print-ready sheets: no navigation, a plain white page, sized for A4 or Letter by the browser's print dialog
// (and by the server's PDF rendering). Each page checks who may read it, as every page does.
export default function SheetLayout({ children }: { children: React.ReactNode }) {
  // On a screen narrower than the sheet, the sheet scrolls sideways inside its own box, never the page.
  return (
    <div className="sheet mx-auto max-w-[52rem] overflow-x-auto bg-white px-6 py-8 text-ink-900 print:max-w-none print:overflow-visible print:p-0">
      {children}
    </div>
  );
}
