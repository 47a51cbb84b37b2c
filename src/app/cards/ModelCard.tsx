import { useStore } from '../../state/store.ts'
import type { ModelSummary } from '../../../workers/protocol.ts'
import { Card } from '../ui/Card.tsx'

type Compute = NonNullable<ModelSummary['compute']>

/** "Computed in 2.31 s; element balance on 1 pool worker beside the engine (shared memory)." */
export function computeLine(c: Compute): string {
  const total = c.stagesMs.reduce((a, [, ms]) => a + ms, 0)
  const how = c.workers > 0
    ? `on ${c.workers} pool worker${c.workers > 1 ? 's' : ''} beside the engine (${c.sharing === 'shared' ? 'shared memory' : 'copied'})`
    : 'in the engine'
  return `Computed in ${(total / 1000).toFixed(2)} s; element balance ${how}.${c.fallback ? ` The worker pool stood down: ${c.fallback}.` : ''}`
}

/**
 * What the loaded model says about itself (its description, where the demo data and its own
 * cautions are stated) and what the reader fixed or noticed. Plain React text only.
 */
export function ModelCard() {
  const model = useStore((s) => s.model)
  if (!model || (!model.description && model.warnings.length === 0 && !model.compute)) return null
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
      {model.compute ? <p className="model-compute" data-testid="model-compute" data-stages={JSON.stringify(model.compute.stagesMs)} data-workers={model.compute.workers} data-sharing={model.compute.sharing}>{computeLine(model.compute)}</p> : null}
    </Card>
  )
}
