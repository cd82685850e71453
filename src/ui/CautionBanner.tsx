import { useModel } from '../state/document';

/** A model's caution (clinical examples) stays in view while the model is open. */
export function CautionBanner() {
  const caution = useModel().caution;
  if (!caution) return null;
  return (
    <div className="lf-caution" role="note" aria-label="Caution">
      <strong>Caution</strong> {caution}
    </div>
  );
}
