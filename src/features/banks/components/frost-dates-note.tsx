/** Why Hilum asks for frost dates instead of working them out, and what the margin is for. */
export function FrostDatesNote() {
  return (
    <div className="grid gap-1.5 rounded-lg border border-frost-200 bg-frost-50 px-3 py-2.5 text-frost-800">
      <p>
        Frost dates are local averages: the usual last frost in spring and first frost in autumn where your
        garden is. Look them up in local weather records or ask your extension service; your own notes from
        past years count too. Hilum never guesses them from a location.
      </p>
      <p>
        A frost can come later than the average, so the safety margin keeps tender plants indoors for some
        days after the last frost date (common practice). Write dates as month-day, like{' '}
        <span className="num font-semibold">05-24</span>; leave them empty and add them later if you are not
        sure.
      </p>
    </div>
  );
}
