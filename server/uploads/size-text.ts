const MB = 1024 ** 2
const GB = 1024 ** 3

/** A byte limit as people say it: "4 GB", "1.5 GB", "200 MB", "0.5 MB". */
export function sizeText(bytes: number): string {
  const [amount, unit] = bytes >= GB ? [bytes / GB, 'GB'] : [bytes / MB, 'MB']
  const rounded = amount >= 10 ? Math.round(amount) : Math.round(amount * 10) / 10
  return `${rounded} ${unit}`
}
