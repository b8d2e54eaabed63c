import type { ReactNode } from 'react';

/**
 * On paper the running head repeats at the top of every page. Chromium repeats a real `<thead>`
 * on each printed page (a `<div>` shown as a table header group is not repeated), so the frame
 * is a layout table — presentational to assistive technology, and plain blocks on screen, where
 * the running head is not shown.
 */
export function PrintFrame({
  runningHead,
  children,
}: {
  runningHead: ReactNode;
  children: ReactNode;
}) {
  return (
    <table role="presentation" className="block w-full print:table">
      <thead className="hidden print:table-header-group" data-running-head>
        <tr className="block print:table-row">
          <td className="block p-0 print:table-cell print:pb-[4mm]">{runningHead}</td>
        </tr>
      </thead>
      <tbody className="block print:table-row-group">
        <tr className="block print:table-row">
          <td className="block p-0 print:table-cell">{children}</td>
        </tr>
      </tbody>
    </table>
  );
}

/**
 * Page size and margins, black on white, and no application header on paper. A `<style>` the
 * screen carries applies only while that screen is shown.
 */
export const printCss = `
@page { size: A4; margin: 12mm 15mm 14mm 15mm; }
@media print {
  header:not(main header) { display: none !important; }
  [data-print-sheet], [data-print-sheet] * { color: #000 !important; background: #fff !important; border-color: #000 !important; }
}
`;
