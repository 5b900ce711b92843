// The small part of gcode-parser that Kerfbook uses (the package ships no types).
declare module 'gcode-parser' {
  export interface ParsedLine {
    /** The line as asked for by lineMode ('compact': comments and whitespace removed). */
    line: string
    /** Each word as [letter, value]; the value is a string when it is not a number. */
    words: Array<[string, number | string]>
    comments?: string[]
    /** The block's line number (N word), when it has one. */
    ln?: number
    cmds?: string[]
  }
  export function parseLine(line: string, options?: { flatten?: boolean, lineMode?: 'original' | 'stripped' | 'compact' }): ParsedLine
}
