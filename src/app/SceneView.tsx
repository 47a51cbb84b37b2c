import { SceneView as Scene3D } from '../scene/index.ts'

/** The 3D view area; the scene components (src/scene) draw into it. */
export function SceneView() {
  return <div className="scene" data-testid="scene"><Scene3D /></div>
}
