"use client";

export default function GlobalError({ reset }: { error: Error; reset: () => void }) {
  return (
    <html lang="en">
      <body style={{ fontFamily: "system-ui", padding: "3rem", background: "#FBF8F1", color: "#1B1A17" }}>
        <h1>Something went wrong</h1>
        <p>Your markings are saved on the server. Try again; if it keeps happening, reload the page.</p>
        <button onClick={() => reset()}>Try again</button>
      </body>
    </html>
  );
}
