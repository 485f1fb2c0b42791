import Link from "next/link";
import { WaveMark } from "@/components/ui/wave-mark";

const steps = [
  { title: "Bring the part in", text: "Upload a MusicXML part — or a whole score with piano — and see it engraved in the browser." },
  { title: "Decide note by note", text: "Mark each note's vibrato depth (how far the pitch swings, in ¢), its speed in pulses per second, where it starts and how it grows or fades, and the note's role in the phrase." },
  { title: "Let the key speak", text: "Ondula reads the key and the melody and suggests the tension tones, where they resolve, and where each phrase starts and peaks — each with a plain reason you can accept or dismiss." },
  { title: "Work on it together", text: "Share the part with your teacher, who comments on notes and proposes changes that you accept or decline." },
  { title: "Take it to the stand", text: "Print a stand copy with your markings above the notes, readable in grayscale, or export it as MusicXML and MIDI." },
];

export default function LandingPage() {
  return (
    <div className="mx-auto max-w-5xl px-gutter py-16">
      <section className="max-w-3xl">
        <WaveMark className="mb-6 text-accent" width={160} height={28} crests={5} />
        <h1 className="text-3xl font-semibold tracking-tight">
          Shape every phrase on purpose.
        </h1>
        <p className="mt-5 text-lg text-graphite">
          Ondula is a workspace for wind players — flutists first — and their teachers. Open a part,
          decide where vibrato begins, how deep and how fast it is, where the phrase peaks and which
          notes hold tension before they resolve. Practise those decisions, talk them through with
          your teacher, and bring a marked copy to the lesson and the stand.
        </p>
        <div className="mt-8 flex flex-wrap gap-3">
          <Link href="/sign-up" className="rounded-card bg-accent px-5 py-2.5 font-semibold text-white hover:bg-accent-strong">
            Create an account
          </Link>
          <Link href="/sign-in" className="rounded-card border border-ink/30 px-5 py-2.5 font-semibold hover:bg-paper-deep">
            Sign in
          </Link>
        </div>
      </section>
      <section aria-labelledby="how" className="mt-16">
        <h2 id="how" className="text-xl font-semibold">How it works</h2>
        <ol className="mt-6 grid gap-5 sm:grid-cols-2 lg:grid-cols-3">
          {steps.map((s, i) => (
            <li key={s.title} className="rounded-card border border-rule bg-paper-card p-5">
              <span className="font-serif text-2xl text-graphite" aria-hidden="true">{i + 1}</span>
              <h3 className="mt-1 text-lg font-semibold">{s.title}</h3>
              <p className="mt-2 text-graphite">{s.text}</p>
            </li>
          ))}
        </ol>
      </section>
    </div>
  );
}
