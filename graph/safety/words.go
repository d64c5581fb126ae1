package safety

// SaysMains tells whether a name or label speaks of the mains ("mains",
// "230 V~", "line"): the same words Assess takes as a mains input, so a
// stage that needs supply evidence reads the mains as the caution does.
func SaysMains(s string) bool { return saysMains(s) }
