import { useEffect } from 'react'
import { useThree } from '@react-three/fiber'
import { useStore } from '../state/store.ts'
import { renderViewToCanvas } from './captureView.ts'

/**
 * Registers the snapshot renderer in the store: the snapshot card asks for a picture of the
 * current view at a pixel size and composes its overlays on the returned canvas. Multisampling
 * only where the GPU is real; software renderers get supersampling from the larger sizes.
 */
export function SnapshotRegistrar() {
  const gl = useThree((s) => s.gl)
  const scene = useThree((s) => s.scene)
  const camera = useThree((s) => s.camera)
  const invalidate = useThree((s) => s.invalidate)
  useEffect(() => {
    const render = (width: number, height: number): HTMLCanvasElement => {
      const software = useStore.getState().renderer !== 'hardware'
      const canvas = renderViewToCanvas(gl, scene, camera, width, height, { samples: software ? 0 : 4 })
      invalidate()
      return canvas
    }
    useStore.getState().setSnapshotRenderer(render)
    return () => {
      if (useStore.getState().snapshotRenderer === render) useStore.getState().setSnapshotRenderer(null)
    }
  }, [gl, scene, camera, invalidate])
  return null
}
