// Tells a GPX or NMEA 0183 log from its first bytes, without loading either reader (the check command and the
// format sniffer need only this much).

export function looksLikeGpx(head: string): boolean {
  const text = head.replace(/^\uFEFF/, '').trimStart();
  return text.startsWith('<') && /<gpx[\s>]/.test(text.slice(0, 4096));
}

/** Half the non-empty lines or more are NMEA 0183 sentences ('$', a talker and a sentence type, a comma). */
export function looksLikeNmea(head: string): boolean {
  const lines = head
    .split(/\r?\n/)
    .map((line) => line.trim())
    .filter((line) => line !== '');
  const sentences = lines.filter((line) => /^\$[A-Z]{2}[A-Z]{3},/.test(line));
  return sentences.length > 0 && sentences.length >= lines.length / 2;
}
