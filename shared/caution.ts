// The caution wording, written once: screens, e-mails and every export use it.
export const CAUTION_TEXT = {
  short: 'These results rank and compare risk; they are not a lightning-protection design.',
  long: 'Where people or property are at stake, protection must be designed and verified by a qualified engineer under the lightning-protection and flammable-liquids storage codes that apply locally.',
} as const

export const CAUTION_FULL = `${CAUTION_TEXT.short} ${CAUTION_TEXT.long}`
