/**
 * The Settings screen's edits. Each setting is saved on its own as soon as it is changed
 * (settings.update); what was typed stays in its box until the store accepts it, so a refusal
 * never loses it. Rates people think of as percents are typed as percents and stored as
 * fractions.
 */
import type { ChannelResponse } from '../../electron/channels.ts';
import { call } from '../bridge.ts';
import type { SaveStatus } from './save-status.ts';
import { parseNumber } from '../text.ts';

export type Settings = ChannelResponse<'settings.get'>;
export type NumberSettingKey =
  'discountRateReal' | 'laborRateUsdPerHour' | 'markupFraction' | 'electricityKgCo2PerKwh';
/** The settings this screen edits: the Portfolio keeps its saved choices itself. */
export type SettingKey = Exclude<keyof Settings, 'portfolioSelections'>;

/** A number setting as the screen shows it: its label, unit, hint and display scale. */
export interface NumberSettingSpec {
  key: NumberSettingKey;
  label: string;
  unit: string;
  hint: string;
  /** Shown value = stored value × scale (100 for a fraction shown as a percent). */
  scale: number;
  /** Whether an empty box means "unknown" (stored as null). */
  emptyIsUnknown: boolean;
}

export const NUMBER_SETTINGS: readonly NumberSettingSpec[] = [
  {
    key: 'discountRateReal',
    label: 'Real discount rate',
    unit: '% a year',
    hint: 'Above inflation; used for present values, SIR and NPV.',
    scale: 100,
    emptyIsUnknown: false,
  },
  {
    key: 'laborRateUsdPerHour',
    label: 'Labour rate',
    unit: '$/h',
    hint: 'What an hour of the crew’s work is charged at.',
    scale: 1,
    emptyIsUnknown: false,
  },
  {
    key: 'markupFraction',
    label: 'Markup',
    unit: '%',
    hint: 'Added on top of materials and labour.',
    scale: 100,
    emptyIsUnknown: false,
  },
  {
    key: 'electricityKgCo2PerKwh',
    label: 'Grid CO₂ factor',
    unit: 'kg CO₂/kWh',
    hint: 'Your utility’s figure; leave empty when unknown.',
    scale: 1,
    emptyIsUnknown: true,
  },
];

/** A stored number in the box's scale, without float noise (0.035 × 100 → "3.5"). */
function shownText(value: number, scale: number): string {
  return String(Number((value * scale).toPrecision(12)));
}

/** The store's words speak of fractions; for a percent box, its numbers are given as percents. */
function inScale(message: string, scale: number): string {
  if (scale === 1) return message;
  return message.replace(/-?\d+(\.\d+)?/g, (number) => `${shownText(Number(number), scale)} %`);
}

export class SettingsEditor {
  stored = $state<Settings | null>(null);
  failure = $state<string | null>(null);
  typed = $state<Partial<Record<SettingKey, string>>>({});
  hasUnsaved = $derived(Object.keys(this.typed).length > 0);
  errors = $state<Partial<Record<SettingKey, string>>>({});
  status = $state<SaveStatus>({ kind: 'idle' });

  /** Reads the stored settings. */
  async load(): Promise<void> {
    const reply = await call('settings.get', {});
    if (reply.ok) {
      this.stored = reply.value;
      this.failure = null;
    } else {
      this.failure = reply.error.message;
    }
  }

  /** The text a box shows: what was typed, else the stored value. */
  textOf(key: SettingKey): string {
    const typed = this.typed[key];
    if (typed !== undefined) return typed;
    const value = this.stored?.[key];
    if (value === undefined || value === null) return '';
    const spec = NUMBER_SETTINGS.find((setting) => setting.key === key);
    return typeof value === 'number' ? shownText(value, spec?.scale ?? 1) : value;
  }

  edit(key: SettingKey, text: string): void {
    this.typed[key] = text;
  }

  /** Saves a number setting's typed text, or says in plain words why it cannot. */
  async commitNumber(spec: NumberSettingSpec): Promise<void> {
    const text = this.typed[spec.key];
    if (text === undefined || this.stored === null) return;
    let value: number | null;
    if (text.trim() === '' && spec.emptyIsUnknown) {
      value = null;
    } else {
      const typedNumber = parseNumber(text);
      if (typedNumber === null) {
        this.#refuse(spec.key, spec.label, 'enter a number, in digits (such as 3 or 0.4).');
        return;
      }
      value = typedNumber / spec.scale;
    }
    if (this.stored[spec.key] === value) {
      this.#settle(spec.key);
      return;
    }
    await this.#save(spec.key, spec.label, { [spec.key]: value }, spec.scale);
  }

  /** Saves a text setting (the user's name) as typed, trimmed; the store judges its length. */
  async commitText(key: 'userName', label: string): Promise<void> {
    const text = this.typed[key];
    if (text === undefined || this.stored === null) return;
    if (this.stored[key] === text.trim()) {
      this.#settle(key);
      return;
    }
    await this.#save(key, label, { [key]: text }, 1);
  }

  /** Saves a choice (units, ranking) at once. */
  async choose(key: 'units' | 'ranking', label: string, value: string): Promise<void> {
    this.typed[key] = value;
    await this.#save(key, label, { [key]: value }, 1);
  }

  async #save(key: SettingKey, label: string, patch: object, scale: number): Promise<void> {
    const text = this.typed[key];
    this.status = { kind: 'saving', label };
    const reply = await call('settings.update', patch as Partial<Settings>);
    // A newer edit of the same box has taken its place; its own save reports.
    if (this.typed[key] !== text) return;
    if (reply.ok) {
      this.stored = reply.value;
      this.#settle(key);
      this.status = { kind: 'saved', label };
      return;
    }
    const own = reply.error.problems?.find((problem) => problem.path === key);
    this.#refuse(key, label, `${inScale(own?.message ?? reply.error.message, scale)}.`);
  }

  #refuse(key: SettingKey, label: string, why: string): void {
    this.errors[key] = why.charAt(0).toUpperCase() + why.slice(1);
    this.status = { kind: 'refused', label, why };
  }

  #settle(key: SettingKey): void {
    delete this.typed[key];
    delete this.errors[key];
  }
}
