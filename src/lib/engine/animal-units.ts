// The animal unit's definitions on their own, apart from the unit conversions, so a page that shows a
// herd's animal units live (the herd page) loads only these two numbers into the browser.

/** An animal-unit month is one animal unit for 30 days (Society for Range Management glossary). */
export const daysPerAnimalUnitMonth = 30;
/** Animal units are counted per 1,000 lb of live weight (Society for Range Management glossary). */
export const lbLiveWeightPerAnimalUnit = 1000;
