/**
 * A deterministic, well-formed flute part of any length for benchmarks: stepwise quarter and
 * eighth notes in G major with occasional ties, slurs and rests.
 */
export function generatePartXml({ measures, seed = 1 }: { measures: number; seed?: number }): string {
  let state = seed >>> 0 || 1;
  const rand = () => {
    state = (state * 1664525 + 1013904223) >>> 0;
    return state / 2 ** 32;
  };
  const steps = ["C", "D", "E", "F", "G", "A", "B"];
  let degree = 14; // D4 counting diatonic steps from C2
  const body: string[] = [];
  for (let m = 1; m <= measures; m++) {
    const notes: string[] = [];
    let beats = 0;
    while (beats < 4) {
      const eighth = rand() < 0.4 && beats <= 3.5;
      const dur = eighth ? 1 : 2; // divisions 2 per quarter
      degree = Math.max(14, Math.min(27, degree + Math.floor(rand() * 5) - 2));
      const step = steps[degree % 7];
      const octave = Math.floor(degree / 7) + 2;
      const alter = step === "F" ? "<alter>1</alter>" : "";
      if (rand() < 0.05) {
        notes.push(`<note><rest/><duration>${dur}</duration><voice>1</voice><type>${eighth ? "eighth" : "quarter"}</type></note>`);
      } else {
        notes.push(
          `<note><pitch><step>${step}</step>${alter}<octave>${octave}</octave></pitch><duration>${dur}</duration><voice>1</voice><type>${eighth ? "eighth" : "quarter"}</type>${alter ? "<accidental>sharp</accidental>" : ""}</note>`,
        );
      }
      beats += dur / 2;
    }
    const attrs = m === 1 ? `<attributes><divisions>2</divisions><key><fifths>1</fifths><mode>major</mode></key><time><beats>4</beats><beat-type>4</beat-type></time><clef><sign>G</sign><line>2</line></clef></attributes><direction placement="above"><direction-type><metronome><beat-unit>quarter</beat-unit><per-minute>84</per-minute></metronome></direction-type><sound tempo="84"/></direction>` : "";
    const barline = m === measures ? `<barline location="right"><bar-style>light-heavy</bar-style></barline>` : "";
    body.push(`<measure number="${m}">${attrs}${notes.join("")}${barline}</measure>`);
  }
  return `<?xml version="1.0" encoding="UTF-8"?>
<score-partwise version="4.0"><work><work-title>Bench Study ${measures}</work-title></work><part-list><score-part id="P1"><part-name>Flute</part-name></score-part></part-list><part id="P1">${body.join("")}</part></score-partwise>`;
}
