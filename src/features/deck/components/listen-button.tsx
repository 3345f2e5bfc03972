import { useEffect, useRef, useState } from 'react';
import { Button } from '@/components/button';
import { defaultPlayS, sonify } from '../lib/sonification';

type AudioContextClass = typeof AudioContext;

function audioContextClass(): AudioContextClass | null {
  if (typeof window === 'undefined') return null;
  const withPrefix = window as unknown as { webkitAudioContext?: AudioContextClass };
  return window.AudioContext ?? withPrefix.webkitAudioContext ?? null;
}

/** Plays the light curve as sound: a tone whose pitch follows brightness, left to right in five seconds. */
export function ListenButton({ hours, ppm }: { hours: readonly number[]; ppm: readonly number[] }) {
  const [playing, setPlaying] = useState(false);
  const stopRef = useRef<(() => void) | null>(null);
  const Context = audioContextClass();

  // A new card, or leaving the Deck, ends whatever is playing.
  // biome-ignore lint/correctness/useExhaustiveDependencies: the series are the trigger, not read here.
  useEffect(() => () => stopRef.current?.(), [hours, ppm]);

  if (!Context) return null;

  function play() {
    if (!Context) return;
    const context = new Context();
    const oscillator = context.createOscillator();
    const gain = context.createGain();
    oscillator.type = 'sine';
    const start = context.currentTime + 0.05;
    const tones = sonify(hours, ppm, defaultPlayS);
    for (const tone of tones)
      oscillator.frequency.linearRampToValueAtTime(tone.frequencyHz, start + tone.atS);
    oscillator.frequency.setValueAtTime(tones[0]?.frequencyHz ?? 440, start);
    // Soft edges, so starting and stopping do not click.
    gain.gain.setValueAtTime(0, start);
    gain.gain.linearRampToValueAtTime(0.18, start + 0.08);
    gain.gain.setValueAtTime(0.18, start + defaultPlayS - 0.1);
    gain.gain.linearRampToValueAtTime(0, start + defaultPlayS);
    oscillator.connect(gain).connect(context.destination);
    oscillator.start(start);
    oscillator.stop(start + defaultPlayS + 0.02);
    const stop = () => {
      stopRef.current = null;
      setPlaying(false);
      oscillator.onended = null;
      try {
        oscillator.stop();
      } catch {
        // Already stopped.
      }
      void context.close();
    };
    oscillator.onended = stop;
    stopRef.current = stop;
    setPlaying(true);
  }

  return (
    <Button
      variant="secondary"
      aria-pressed={playing}
      onClick={() => (playing ? stopRef.current?.() : play())}
      className="text-sm"
    >
      <svg
        aria-hidden="true"
        viewBox="0 0 20 20"
        className="size-4"
        fill="none"
        stroke="currentColor"
        strokeWidth="2"
      >
        {playing ? (
          <path d="M6 5v10M14 5v10" />
        ) : (
          <path d="M3 8v4h3l4 4V4L6 8H3zM13 7a4 4 0 010 6M15.5 4.5a7.5 7.5 0 010 11" />
        )}
      </svg>
      {playing ? 'Stop' : 'Listen'}
    </Button>
  );
}
