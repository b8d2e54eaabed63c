import { useId } from 'react';
import { Button } from '../../../components/ui/button';
import { SoundOffIcon, SoundOnIcon } from '../../../components/ui/icons';
import { playCue } from '../hooks/use-cues';
import { turnOnAudioOutput, useAudioOutputState } from '../hooks/use-audio-output';

/**
 * What the cues will really do, from the AudioContext's own state: "Sound on" only while it runs.
 * After a reload the browser keeps the page silent until a tap, so a large control asks for one;
 * a nurse who chose silence ("Sound off") is not asked.
 */
export function SoundControl({
  muted,
  setMuted,
}: {
  muted: boolean;
  setMuted: (muted: boolean) => void;
}) {
  const output = useAudioOutputState();
  const hintId = useId();

  if (output === 'unsupported') {
    return (
      <p className="flex items-center gap-1.5 font-medium text-paper-900">
        <SoundOffIcon className="size-5 shrink-0" />
        This browser cannot play the sound cues: watch for the flash.
      </p>
    );
  }

  if (!muted && output !== 'running') {
    return (
      <div
        role="status"
        className="flex w-full flex-col gap-1.5 rounded-xl border-2 border-paper-900 bg-white p-2.5"
      >
        <p className="flex items-center gap-2 text-lg font-semibold text-paper-950">
          <SoundOffIcon className="size-6 shrink-0" />
          Sound is off
        </p>
        <p id={hintId} className="text-sm text-paper-800">
          After a reload this browser plays the cues only once the screen has been tapped. The flash
          still shows.
        </p>
        <Button
          className="w-full text-lg font-semibold"
          icon={<SoundOnIcon />}
          aria-describedby={hintId}
          onClick={() => {
            // The press itself is the gesture the browser waits for; a short tone proves it worked.
            void turnOnAudioOutput().then((state) => {
              if (state === 'running') playCue('soon');
            });
          }}
        >
          Tap to turn sound back on
        </Button>
      </div>
    );
  }

  return (
    <>
      <Button
        variant="quiet"
        size="sm"
        icon={muted ? <SoundOffIcon /> : <SoundOnIcon />}
        aria-describedby={hintId}
        onClick={() => {
          if (muted) void turnOnAudioOutput();
          setMuted(!muted);
        }}
      >
        {muted ? 'Sound off' : 'Sound on'}
      </Button>
      <span id={hintId} className="sr-only">
        {muted
          ? 'Press to turn the sound cues back on; the flash and vibration stay.'
          : 'Press to mute the sound cues; the flash and vibration stay.'}
      </span>
    </>
  );
}
