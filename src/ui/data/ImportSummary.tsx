/** What the importer kept and refused, by reason, row and column: nothing is dropped without a line here. */
import { useId } from 'react';
import type { Dataset } from '../../state/dataset';

const SHOWN = 50;

export function ImportSummaryView({ dataset }: { dataset: Dataset }) {
  const id = useId();
  const { summary: s, issues, moreIssues, panel } = dataset.result;
  const fileIssue = issues.find((i) => i.action === 'file refused');
  const when = new Date(dataset.importedAt).toLocaleString();
  return (
    <section className="lf-data-section" aria-labelledby={`${id}-h`} data-testid="import-summary">
      <h3 id={`${id}-h`}>What was imported</h3>
      <p className="lf-data-note">{dataset.fileName}, imported {when}{panel ? `; times in ${panel.timeUnit}` : ''}.</p>
      {fileIssue && <p className="lf-data-error" role="alert">The file was refused: {fileIssue.message}</p>}
      <p className="lf-data-counts" data-testid="import-counts">
        {s.rows} rows read · <strong>{s.kept}</strong> occasions kept · <strong>{s.refused}</strong> refused · {s.persons} persons
      </p>
      {s.reasons.length > 0 && (
        <table className="lf-data-table" aria-label="Reasons for refused rows and missing cells">
          <thead><tr><th scope="col">what happened</th><th scope="col">why</th><th scope="col">column</th><th scope="col">times</th><th scope="col">first rows</th></tr></thead>
          <tbody>
            {s.reasons.map((r, k) => (
              <tr key={k}>
                <td>{r.action}</td>
                <td>{r.reason}</td>
                <td className="lf-data-raw">{r.column ?? '—'}</td>
                <td>{r.count}</td>
                <td className="lf-data-raw">{r.rows.join(', ')}{r.count > r.rows.length ? ', …' : ''}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {s.reasons.length === 0 && !fileIssue && <p className="lf-data-note">Every row was kept and every cell read as a number or a missing value.</p>}
      {s.missing.length > 0 && (
        <p className="lf-data-note">Missing cells among the kept occasions: {s.missing.map((m) => `${m.variable} ${m.missing} of ${m.total}`).join('; ')}.</p>
      )}
      {s.unsortedPersons > 0 && <p className="lf-data-note">The rows of {s.unsortedPersons} persons were not in time order; they were sorted.</p>}
      {s.notes.map((n) => <p key={n} className="lf-data-note">Note: {n}</p>)}
      {issues.length > 0 && (
        <details>
          <summary>Every issue by row and column ({issues.length + moreIssues})</summary>
          <ul className="lf-data-list">
            {issues.slice(0, SHOWN).map((i, k) => <li key={k}>row {i.row}{i.column ? `, column ${i.column}` : ''}: {i.message} ({i.action})</li>)}
          </ul>
          {issues.length + moreIssues > SHOWN && <p className="lf-data-note">and {issues.length + moreIssues - SHOWN} more (the command <code>loopfold data FILE --json</code> lists up to 1,000).</p>}
        </details>
      )}
    </section>
  );
}
