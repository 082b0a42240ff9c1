/** Sets the tab title ("People · Ridgeback Timber Co. · Bellwether"); React 19 hoists <title> into <head>. */
export function DocumentTitle({ title }: { title: string }) {
  return <title>{`${title} · Bellwether`}</title>;
}
