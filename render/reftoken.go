package render

// RefToken is a part's ref as the sheet writes it in the data-ref attribute
// of the part's group (the attribute whitelist, attr): a page that embeds
// the sheet finds a part's symbol by it, as the HTML note's hover does.
// Two refs that differ only in characters outside the whitelist share a
// token.
func RefToken(ref string) string { return attr(ref) }
