/**
 * The export dialog: the print options of the command line for any figure
 * of the app (width preset or a length, base font size, palette, background,
 * title, caption), then an SVG or a PNG at a DPI made by the same code as
 * `loopfold render` / `--out` (see printFile.ts), or for PDF the equivalent
 * command line to copy (the command line embeds the fonts).
 */
import { useEffect, useId, useRef, useState } from 'react';
import { withDpi } from '../../export/print/png';
import { BACKGROUNDS, DEFAULT_FONT_PT, parseFontSize, parseWidth, type Background, type PrintOptions } from '../../export/print/options';
import { PALETTES, type PaletteName } from '../../theme/palettes';
import { browserElk } from '../../layout/browser';
import { downloadBlob } from '../download';
import { svgPng } from '../figureFiles';
import { cliArgs, commandText, pngPixels, printedFigure, printedSvg, type FigureSource } from './printFile';
import './export.css';
import { useModalDialog } from '../modal';
import { fixedText } from '../../present/index';

type WidthChoice = 'column' | '1.5-column' | 'two-columns' | 'own' | 'length';
const WIDTHS: { value: WidthChoice; text: string }[] = [
  { value: 'column', text: 'one column (8.5 cm)' },
  { value: '1.5-column', text: 'one and a half columns (11.4 cm)' },
  { value: 'two-columns', text: 'two columns (17.8 cm)' },
  { value: 'length', text: 'a width in mm, cm or px' },
  { value: 'own', text: "the figure's own size" },
];
const PALETTE_TEXT: Record<PaletteName, string> = { default: 'default', 'colour-blind': 'colour-blind-safe', greyscale: 'greyscale' };
const BACKGROUND_TEXT: Record<Background, string> = { white: 'white', transparent: 'transparent', paper: 'paper tone (as in the app)' };

export interface ExportDialogProps {
  /** What the figure shows, for the heading: "the ordering", "the lagged network". */
  what: string;
  /** The file name without extension. */
  name: string;
  /** The model's file name in the command line shown for PDF. */
  modelFile: string;
  /** The figure to export, asked for when a file is made (null: it cannot be drawn now, with the reason). */
  source: () => Promise<FigureSource | { problem: string }> | FigureSource | { problem: string };
  onClose: () => void;
}

/** The options as typed, checked: a message naming the field, or the print options. */
function checked(width: WidthChoice, length: string, font: string, palette: PaletteName, background: Background, title: boolean, caption: string): { ok: true; opts: PrintOptions } | { ok: false; message: string } {
  const opts: PrintOptions = { palette, title };
  if (width !== 'own') {
    const w = parseWidth(width === 'length' ? length : width);
    if (!w.ok) return { ok: false, message: `Width: ${w.message.replace(/^--width: /, '')}` };
    opts.width = w.value;
  }
  if (font.trim() !== '') {
    const f = parseFontSize(font);
    if (!f.ok) return { ok: false, message: `Base font size: ${f.message.replace(/^--font-size: /, '')}` };
    if (f.value !== DEFAULT_FONT_PT) opts.fontSize = f.value;
  }
  if (background !== 'white') opts.background = background;
  if (caption.trim() !== '') opts.caption = caption.trim();
  return { ok: true, opts };
}

/** The SVG drawn on a canvas at the print width and DPI, the DPI written into the PNG. */
async function svgToPng(svg: string, size: { width: number; height: number }, dpi: number): Promise<Blob> {
  const blob = await svgPng(svg, size);
  const bytes = withDpi(new Uint8Array(await blob.arrayBuffer()), dpi);
  return new Blob([bytes.slice().buffer], { type: 'image/png' });
}

export function ExportDialog({ what, name, modelFile, source, onClose }: ExportDialogProps) {
  const ref = useRef<HTMLDialogElement>(null);
  useModalDialog(ref, true);
  const id = useId();
  const [width, setWidth] = useState<WidthChoice>('column');
  const [length, setLength] = useState('120mm');
  const [font, setFont] = useState(String(DEFAULT_FONT_PT));
  const [palette, setPalette] = useState<PaletteName>('default');
  const [background, setBackground] = useState<Background>('white');
  const [title, setTitle] = useState(true);
  const [caption, setCaption] = useState('');
  const [format, setFormat] = useState<'svg' | 'png' | 'pdf'>('svg');
  const [dpi, setDpi] = useState('300');
  const [status, setStatus] = useState<{ tone: 'note' | 'error'; lines: string[] } | null>(null);
  const [busy, setBusy] = useState(false);
  const [copied, setCopied] = useState(false);
  const [command, setCommand] = useState<string | null>(null);

  const check = checked(width, length, font, palette, background, title, caption);
  const dpiValue = Number(dpi);
  const dpiOk = Number.isFinite(dpiValue) && dpiValue >= 36 && dpiValue <= 2400;
  const problem = !check.ok ? check.message : format === 'png' && !dpiOk ? `DPI: "${dpi}" must be a number from 36 to 2400, e.g. 300` : null;

  // the command line for PDF follows the options as they are typed
  useEffect(() => {
    if (format !== 'pdf' || !check.ok) { setCommand(null); return; }
    let live = true;
    void Promise.resolve(source()).then((s) => {
      if (!live) return;
      if ('problem' in s) { setCommand(null); setStatus({ tone: 'error', lines: [s.problem] }); return; }
      const args = cliArgs(s, modelFile, check.opts, `${name}.pdf`);
      setCommand(args ? commandText(args) : null);
    });
    return () => { live = false; };
  }, [format, JSON.stringify(check), modelFile, name]); // eslint-disable-line react-hooks/exhaustive-deps

  const make = async () => {
    if (!check.ok || problem) return;
    setBusy(true);
    setStatus(null);
    try {
      const s = await source();
      if ('problem' in s) { setStatus({ tone: 'error', lines: [s.problem] }); return; }
      const fig = await printedFigure(s, check.opts, browserElk);
      if (!fig) { setStatus({ tone: 'error', lines: ['This figure cannot be drawn with the current results.'] }); return; }
      const svg = printedSvg(fig);
      if (format === 'svg') downloadBlob(new Blob([svg], { type: 'image/svg+xml' }), `${name}.svg`);
      else downloadBlob(await svgToPng(svg, pngPixels(fig, check.opts, dpiValue), dpiValue), `${name}.png`);
      setStatus({ tone: 'note', lines: [`Saved ${name}.${format}; its smallest text is ${fixedText(fig.smallestPt, 1)} pt.`, ...fig.notes.map((n) => `To fit: ${n}.`)] });
    } catch (e) {
      setStatus({ tone: 'error', lines: [`The file could not be made: ${(e as Error).message ?? String(e)}`] });
    } finally {
      setBusy(false);
    }
  };

  const copy = async () => {
    if (!command) return;
    try {
      await navigator.clipboard.writeText(command);
      setCopied(true);
    } catch {
      setStatus({ tone: 'error', lines: ['The browser did not allow copying: select the command and copy it by hand.'] });
    }
  };

  return (
    <dialog ref={ref} className="lf-dialog lf-export-dialog" aria-labelledby={`${id}-title`} onClose={onClose}>
      <h2 id={`${id}-title`}>Export {what} for print</h2>
      <form onSubmit={(e) => { e.preventDefault(); if (format !== 'pdf') void make(); }}>
        <div className="lf-export-grid">
          <label htmlFor={`${id}-width`}>Width</label>
          <select id={`${id}-width`} value={width} onChange={(e) => setWidth(e.target.value as WidthChoice)}>
            {WIDTHS.map((w) => <option key={w.value} value={w.value}>{w.text}</option>)}
          </select>
          {width === 'length' && (
            <>
              <label htmlFor={`${id}-length`}>Width as a length</label>
              <input id={`${id}-length`} value={length} onChange={(e) => setLength(e.target.value)} placeholder="120mm, 12cm or 800px" aria-invalid={!check.ok && check.message.startsWith('Width')} />
            </>
          )}
          <label htmlFor={`${id}-font`}>Base font size (pt)</label>
          <input id={`${id}-font`} inputMode="decimal" value={font} onChange={(e) => setFont(e.target.value)} aria-invalid={!check.ok && check.message.startsWith('Base font')} />
          <label htmlFor={`${id}-palette`}>Palette</label>
          <select id={`${id}-palette`} value={palette} onChange={(e) => setPalette(e.target.value as PaletteName)}>
            {PALETTES.map((p) => <option key={p} value={p}>{PALETTE_TEXT[p]}</option>)}
          </select>
          <label htmlFor={`${id}-background`}>Background</label>
          <select id={`${id}-background`} value={background} onChange={(e) => setBackground(e.target.value as Background)}>
            {BACKGROUNDS.map((b) => <option key={b} value={b}>{BACKGROUND_TEXT[b]}</option>)}
          </select>
          <span />
          <label><input type="checkbox" checked={title} onChange={(e) => setTitle(e.target.checked)} /> Title line</label>
          <label htmlFor={`${id}-caption`}>Caption</label>
          <textarea id={`${id}-caption`} rows={2} value={caption} onChange={(e) => setCaption(e.target.value)} placeholder="Empty: the figure's own caption" />
        </div>
        <fieldset className="lf-export-format">
          <legend>File</legend>
          {(['svg', 'png', 'pdf'] as const).map((f) => (
            <label key={f}><input type="radio" name={`${id}-format`} checked={format === f} onChange={() => setFormat(f)} /> {f.toUpperCase()}</label>
          ))}
          {format === 'png' && (
            <label>
              {' '}at <input className="lf-export-dpi" inputMode="numeric" value={dpi} onChange={(e) => setDpi(e.target.value)} aria-label="PNG resolution (DPI)" aria-invalid={!dpiOk} /> DPI
            </label>
          )}
        </fieldset>
        {problem && <p className="lf-problem" role="alert">{problem}</p>}
        {format === 'pdf' && !problem && (
          <div className="lf-export-command">
            <p className="lf-hint">A PDF with its fonts embedded is written by the command line. Save the model as <code>{modelFile}</code> and run, in the project's folder:</p>
            {command ? (
              <>
                <textarea readOnly rows={3} value={command} aria-label="Command line for the PDF" onFocus={(e) => e.currentTarget.select()} />
                <button type="button" onClick={() => void copy()}>{copied ? 'Copied' : 'Copy command'}</button>
              </>
            ) : (
              <p className="lf-hint">No command draws this figure; export it as SVG and convert it.</p>
            )}
          </div>
        )}
        {status && (
          <div className={status.tone === 'error' ? 'lf-problem' : 'lf-hint'} role={status.tone === 'error' ? 'alert' : 'status'}>
            {status.lines.map((l, i) => <p key={i}>{l}</p>)}
          </div>
        )}
        <div className="lf-export-actions">
          {format !== 'pdf' && <button type="submit" disabled={busy || problem !== null}>{busy ? 'Making…' : `Download ${format.toUpperCase()}`}</button>}
          <button type="button" onClick={() => ref.current?.close()}>Close</button>
        </div>
      </form>
    </dialog>
  );
}
