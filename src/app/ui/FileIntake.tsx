import { forwardRef, useEffect, useState } from 'react'
import { openFiles } from '../actions.ts'

/**
 * The hidden file input (several files at once: a CSV bundle, or one .tractus container) and a
 * drop target over the whole window.
 */
export const FileIntake = forwardRef<HTMLInputElement>(function FileIntake(_props, ref) {
  const [over, setOver] = useState(false)
  useEffect(() => {
    let depth = 0
    const hasFiles = (e: DragEvent): boolean => !!e.dataTransfer && Array.from(e.dataTransfer.types).includes('Files')
    const enter = (e: DragEvent): void => { if (hasFiles(e)) { depth++; setOver(true); e.preventDefault() } }
    const leave = (e: DragEvent): void => { if (hasFiles(e)) { depth = Math.max(0, depth - 1); if (depth === 0) setOver(false) } }
    const dragOver = (e: DragEvent): void => { if (hasFiles(e)) { e.preventDefault(); e.dataTransfer!.dropEffect = 'copy' } }
    const drop = (e: DragEvent): void => {
      if (!hasFiles(e)) return
      e.preventDefault()
      depth = 0
      setOver(false)
      void openFiles(Array.from(e.dataTransfer!.files))
    }
    window.addEventListener('dragenter', enter)
    window.addEventListener('dragleave', leave)
    window.addEventListener('dragover', dragOver)
    window.addEventListener('drop', drop)
    return () => {
      window.removeEventListener('dragenter', enter)
      window.removeEventListener('dragleave', leave)
      window.removeEventListener('dragover', dragOver)
      window.removeEventListener('drop', drop)
    }
  }, [])
  return (
    <>
      <input
        ref={ref} type="file" multiple hidden data-testid="file-input" accept=".csv,.json,.tractus"
        onChange={(e) => { const files = Array.from(e.target.files ?? []); e.target.value = ''; void openFiles(files) }}
      />
      {over ? (
        <div className="drop-zone" data-testid="drop-zone">
          <p>Drop nodes.csv, elements.csv, stress.csv (and model.json, displacement.csv) together, or one .tractus file. Files named otherwise are matched in the next step.</p>
        </div>
      ) : null}
    </>
  )
})
