import { useState } from 'react'
import type { ReactNode } from 'react'

/** A foldable card. `id` names it for tests and shortcuts. */
export function Card({ id, title, children, open: initial = true, extra }: { id: string; title: string; children: ReactNode; open?: boolean; extra?: ReactNode }) {
  const [open, setOpen] = useState(initial)
  return (
    <section className={'card' + (open ? ' open' : '')} data-card={id} aria-label={title}>
      <header>
        <button type="button" className="fold" aria-expanded={open} onClick={() => setOpen(!open)}>
          <span className="chev" aria-hidden>{open ? '▾' : '▸'}</span> {title}
        </button>
        {extra}
      </header>
      {open ? <div className="body">{children}</div> : null}
    </section>
  )
}
