export function SiteFooter() {
  return (
    <footer className="mt-16 border-t border-chalk-200 bg-chalk-100">
      <div className="mx-auto max-w-page px-4 py-6 text-xs text-ink-500">
        <p>
          Lacewright connects riders with independent wheel builders. Fitment and cost figures are estimates; a qualified builder checks every
          wheel, and frame work follows local practice.
        </p>
        <p className="mt-1">Fonts: Bricolage Grotesque and Public Sans, SIL Open Font License (see /fonts).</p>
      </div>
    </footer>
  );
}
