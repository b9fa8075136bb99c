// How the watch calls the observer: a short beep through WebAudio (no sound file to ship) and a
// system notification when the observer allowed them. Both fail quietly where the browser
// offers neither: the on-screen due state is always there.

let ctx: AudioContext | null = null;

/** Two short tones; louder and lower for overdue. Returns false when no audio is possible. */
export function beep(kind: 'due' | 'overdue'): boolean {
  const AC = globalThis.AudioContext ?? (globalThis as { webkitAudioContext?: typeof AudioContext }).webkitAudioContext;
  if (!AC) return false;
  try {
    ctx ??= new AC();
    if (ctx.state === 'suspended') void ctx.resume();
    const t0 = ctx.currentTime;
    const freq = kind === 'due' ? 880 : 660;
    for (let i = 0; i < 2; i++) {
      const osc = ctx.createOscillator();
      const gain = ctx.createGain();
      osc.type = 'sine';
      osc.frequency.value = freq;
      const start = t0 + i * 0.35;
      gain.gain.setValueAtTime(0.0001, start);
      gain.gain.exponentialRampToValueAtTime(kind === 'due' ? 0.3 : 0.6, start + 0.02);
      gain.gain.exponentialRampToValueAtTime(0.0001, start + 0.25);
      osc.connect(gain).connect(ctx.destination);
      osc.start(start);
      osc.stop(start + 0.3);
    }
    return true;
  } catch {
    return false;
  }
}

export function notificationsSupported(): boolean {
  return typeof Notification !== 'undefined';
}

export function notificationPermission(): NotificationPermission | 'unsupported' {
  return notificationsSupported() ? Notification.permission : 'unsupported';
}

export async function askNotificationPermission(): Promise<NotificationPermission | 'unsupported'> {
  if (!notificationsSupported()) return 'unsupported';
  try {
    return await Notification.requestPermission();
  } catch {
    return Notification.permission;
  }
}

/** Shows a system notification if allowed; one per slot (the tag replaces an older one). */
export function notify(title: string, body: string, tag: string): boolean {
  if (!notificationsSupported() || Notification.permission !== 'granted') return false;
  try {
    new Notification(title, { body, tag });
    return true;
  } catch {
    return false;
  }
}
