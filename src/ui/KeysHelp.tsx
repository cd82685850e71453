const KEYS: [string, string][] = [
  ['N or Insert', 'add a variable at the centre of the view'],
  ['double-click', 'add a variable where you click'],
  ['Tab, then Enter', 'reach and select a variable or link'],
  ['arrow keys', 'move the selected variables'],
  ['Delete', 'remove what is selected'],
  ['Ctrl+C, Ctrl+V', 'copy and paste the selected variables'],
  ['Ctrl+A', 'select everything'],
  ['Ctrl+Z; Shift+Ctrl+Z or Ctrl+Y', 'undo; redo'],
  ['Ctrl+S', 'save'],
  ['F', 'fit the drawing into view (never below 11 px text: a big drawing is panned)'],
  ['Shift+drag', 'select with a box'],
  ['New link to (inspector)', 'add a link from the selected variable with the keyboard'],
  ['P', 'present: the ordering, the interval and the explanation large; arrows or Page Up/Down step the band, Esc leaves'],
];

/** The editor's keys, one click away from the status line. */
export function KeysHelp() {
  return (
    <details className="lf-keys">
      <summary>Keys</summary>
      <dl>
        {KEYS.map(([k, what]) => (
          <div key={k}>
            <dt><kbd>{k}</kbd></dt>
            <dd>{what}</dd>
          </div>
        ))}
      </dl>
      <p className="lf-credit">The canvas is drawn with the xyflow library (MIT licence).</p>
    </details>
  );
}
