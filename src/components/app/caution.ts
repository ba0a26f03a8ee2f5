/** The caution every Deckshare screen and report carries about what its results are. */
export const CAUTION_TEXT =
  "Deckshare's results are aids to a licensed engineer's judgement; local codes, owner policies and licensed practice govern.";
