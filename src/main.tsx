import { StrictMode } from 'react'
import { createRoot } from 'react-dom/client'
import { App } from './app/App.tsx'
import { engine } from './app/engine.ts'
import { installTestHooks } from './app/testHooks.ts'
import './app/app.css'

// The browser tests' hooks exist only in the end-to-end build; the release build drops the call
// and, with it, the module.
if (import.meta.env.MODE === 'e2e') installTestHooks(engine)

createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <App />
  </StrictMode>,
)
