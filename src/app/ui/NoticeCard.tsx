import { useStore } from '../../state/store.ts'

/** What a link could not do as it stands (a view waiting for the user's files, a demo this build lacks); plain text. */
export function NoticeCard() {
  const notice = useStore((s) => s.linkNotice)
  const setLinkNotice = useStore((s) => s.setLinkNotice)
  if (!notice) return null
  return (
    <div className="notice-card" role="status" data-testid="link-notice" data-kind={notice.kind}>
      <h2>{notice.kind === 'needs-files' ? 'This link needs your model' : 'This link names another model'}</h2>
      <p className="msg">{notice.message}</p>
      {notice.files ? <ul className="files">{notice.files.map((f) => <li key={f}><code>{f}</code></li>)}</ul> : null}
      <button type="button" data-testid="link-notice-dismiss" onClick={() => setLinkNotice(null)}>Dismiss</button>
    </div>
  )
}
