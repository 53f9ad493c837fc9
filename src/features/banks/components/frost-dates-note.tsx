/** Why Hilum asks for frost dates instead of working them out. */
export function FrostDatesNote() {
  return (
    <p className="rounded-lg border border-frost-200 bg-frost-50 px-3 py-2.5 text-frost-800">
      Frost dates are the average last frost in spring and first frost in autumn where your garden is. You know them
      best — from your own notes, your neighbours or your local extension service. Hilum never guesses them from a
      location. Write them as month-day, like <span className="num font-semibold">05-24</span>; leave them empty
      and add them later if you are not sure.
    </p>
  );
}
