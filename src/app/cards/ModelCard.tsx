import { useStore } from '../store.ts'
import { Card } from '../ui/Card.tsx'

/**
 * What the loaded model says about itself (its description, where the demo data and its own
 * cautions are stated) and what the reader fixed or noticed. Plain React text only.
 */
export function ModelCard() {
  const model = useStore((s) => s.model)
  if (!model || (!model.description && model.warnings.length === 0)) return null
  // A model may carry its own caution ("Caution: ..."); it is shown first, where it is seen.
  const at = model.description.search(/\bcaution:/i)
  const caution = at >= 0 ? model.description.slice(at).trim() : ''
  const rest = at >= 0 ? model.description.slice(0, at).trim() : model.description
  return (
    <Card id="model" title="About this model">
      {caution ? <p className="model-caution" data-testid="model-caution">{caution}</p> : null}
      {rest ? <p className="model-description" data-testid="model-description">{rest}</p> : null}
      {model.warnings.length ? (
        <ul className="model-warnings" data-testid="model-warnings">
          {model.warnings.map((w, i) => <li key={i}>{w}</li>)}
        </ul>
      ) : null}
    </Card>
  )
}
