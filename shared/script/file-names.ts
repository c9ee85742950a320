/** File names for an outline's exports: title and take in lower case joined by dashes, then what the file is. */
export function exportFileName(title: string, take: string, what: string): string {
  return `${slug(`${title} ${take}`)}-${what}`
}

function slug(text: string): string {
  return (
    text
      .normalize('NFKD')
      .replace(/[^\w\s-]/g, '')
      .trim()
      .toLowerCase()
      .replace(/[\s_-]+/g, '-')
      .slice(0, 80) || 'outline'
  )
}
