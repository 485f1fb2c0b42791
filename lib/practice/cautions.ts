/** Shown wherever Ondula plays sound ("Cautions the product shows" in the design brief). */
export const AUDITION_CAUTION = "Audio starts quiet; keep headphone volume moderate.";
