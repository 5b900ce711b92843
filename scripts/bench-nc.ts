// Times the NC program reader on a program of 100,000 moves (about 3 MB, as a CAM post writes a
// 3D surfacing job: short lines and arcs at feed, with a few tool changes), and LinuxCNC's
// standalone interpreter rs274 on the same file when it is installed. Not a test: a figure for
// the README.  node --import tsx scripts/bench-nc.ts [moves]
import { execFileSync } from 'node:child_process'
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { readNcProgram } from '../shared/kerf/nc/read'

const moves = Number(process.argv[2] ?? 100_000)
const lines = ['%', '(surfacing benchmark)', 'G21 G90 G17 G94', 'T1 M6', 'S18000 M3', 'G0 X0 Y0 Z5', 'G1 Z-1 F600']
let n = 10
let px = 0, py = 0
for (let i = 0; i < moves; i++) {
  if (i > 0 && i % 25_000 === 0) lines.push(`N${n += 10} G0 Z5`, `N${n += 10} T${1 + (i / 25_000)} M6`, `N${n += 10} S16000 M3`, `N${n += 10} G1 Z-1 F600`)
  const row = Math.floor(i / 200)
  const x = (row % 2 ? 200 - (i % 200) : i % 200) * 0.75
  const y = row * 0.5
  const z = -1 - 0.35 * Math.sin(i / 37) - 0.2 * Math.cos(row / 9)
  // Every tenth move is a half circle to the next point (centre midway), the rest are lines.
  if (i % 10 === 9) lines.push(`N${n += 10} G3 X${x.toFixed(4)} Y${y.toFixed(4)} Z${z.toFixed(4)} I${((x - px) / 2).toFixed(4)} J${((y - py) / 2).toFixed(4)} F2400`)
  else lines.push(`G1 X${x.toFixed(3)} Y${y.toFixed(3)} Z${z.toFixed(3)} F${i % 2 ? 2400 : 2500}`)
  px = Number(x.toFixed(4)); py = Number(y.toFixed(4))
}
lines.push('G0 Z25', 'M5', 'M30', '%')
const dir = mkdtempSync(path.join(tmpdir(), 'kerfbook-nc-'))
const file = path.join(dir, 'bench.ngc')
writeFileSync(file, lines.join('\n') + '\n')
writeFileSync(path.join(dir, 'tools.tbl'), [1, 2, 3, 4, 5].map((t) => `T${t} P${t} D6.35 ;`).join('\n') + '\n')
const bytes = readFileSync(file).length

const median = (xs: number[]) => xs.sort((a, b) => a - b)[Math.floor(xs.length / 2)]!
// Wall time, and CPU time, which the other work on a shared machine disturbs far less.
const ours: number[] = []
const oursCpu: number[] = []
let reading: ReturnType<typeof readNcProgram> | undefined
for (let k = 0; k < 7; k++) {
  const started = performance.now()
  const cpu = process.cpuUsage()
  reading = readNcProgram(readFileSync(file, 'utf8'))
  const used = process.cpuUsage(cpu)
  ours.push(performance.now() - started)
  oursCpu.push((used.user + used.system) / 1000)
}
console.log(`program: ${moves.toLocaleString('en-US')} moves, ${(bytes / 1e6).toFixed(2)} MB, ${reading!.tools.length} tools, ${reading!.problems.length} problems`)
console.log(`Kerfbook's reader (read the file + read the program), median of 7: ${median(ours).toFixed(0)} ms wall (fastest ${Math.min(...ours).toFixed(0)} ms), ${median(oursCpu).toFixed(0)} ms CPU`)

let hasRs274 = true
try { execFileSync('sh', ['-c', 'command -v rs274'], { stdio: 'ignore' }) } catch { hasRs274 = false }
if (hasRs274) {
  const theirs: number[] = []
  const theirsCpu: number[] = []
  for (let k = 0; k < 5; k++) {
    const started = performance.now()
    // bash's `times` prints the CPU its children used: user and system, on its second line.
    const out = execFileSync('bash', ['-c', 'rs274 -t "$1" -g "$2" "$3" </dev/null >/dev/null 2>&1; times', 'bench', path.join(dir, 'tools.tbl'), file, path.join(dir, 'canon.txt')], { encoding: 'utf8' })
    theirs.push(performance.now() - started)
    const seconds = (out.trim().split('\n')[1] ?? '').split(/\s+/).map((t) => { const m = /(\d+)m([\d.]+)s/.exec(t); return m ? Number(m[1]) * 60 + Number(m[2]) : 0 })
    theirsCpu.push(seconds.reduce((a, b) => a + b, 0) * 1000)
  }
  console.log(`rs274 (LinuxCNC's standalone interpreter, writing its canonical moves to a file), median of 5: ${median(theirs).toFixed(0)} ms wall, ${median(theirsCpu).toFixed(0)} ms CPU`)
} else {
  console.log('rs274 is not installed (Debian package linuxcnc-uspace): no comparison')
}
rmSync(dir, { recursive: true, force: true })
