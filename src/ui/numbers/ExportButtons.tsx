import { useState } from 'react';
import { downloadPng, downloadSvg } from '../figureFiles';
import { ExportDialog, type ExportDialogProps } from '../export/ExportDialog';

/**
 * SVG and PNG (1×, 2×, 4×) export of one figure of the Numbers pane. `svg`
 * gives the file's text (the exporter's builder, with heading and caption):
 * the same bytes as the command line writes for the same inputs. `print`
 * opens the export dialog (width, font size, palette, background, title,
 * caption; PNG at a DPI; the command line for PDF).
 */
export function ExportButtons({ what, name, svg, print }: { what: string; name: string; svg: () => string; print?: Pick<ExportDialogProps, 'source' | 'modelFile'> }) {
  const [error, setError] = useState<string | null>(null);
  const [printing, setPrinting] = useState(false);
  const png = (scale: 1 | 2 | 4) => {
    setError(null);
    downloadPng(svg(), name, scale).catch((e: unknown) => setError(`The PNG could not be made: ${(e as Error).message ?? String(e)}`));
  };
  return (
    <div className="lf-num-row lf-num-export" role="group" aria-label={`Export ${what}`}>
      <span className="lf-num-note">Export {what}:</span>
      <button type="button" className="lf-num-small" aria-label={`Export ${what} as SVG`} onClick={() => { setError(null); downloadSvg(svg(), name); }}>SVG</button>
      <button type="button" className="lf-num-small" aria-label={`Export ${what} as PNG 1×`} onClick={() => png(1)}>PNG 1×</button>
      <button type="button" className="lf-num-small" aria-label={`Export ${what} as PNG 2×`} onClick={() => png(2)}>2×</button>
      <button type="button" className="lf-num-small" aria-label={`Export ${what} as PNG 4×`} onClick={() => png(4)}>4×</button>
      {print && <button type="button" className="lf-num-small" aria-label={`Export ${what} with print options`} onClick={() => setPrinting(true)}>Print options…</button>}
      {print && printing && <ExportDialog what={what} name={name} modelFile={print.modelFile} source={print.source} onClose={() => setPrinting(false)} />}
      {error && <span className="lf-num-error" role="alert">{error}</span>}
    </div>
  );
}
