/**
 * Where a sweep runs, in the plan form: offered only when the server has a Redis queue (its health lists more than
 * one executor); the queue first and chosen, as the server's default. On a server without a queue nothing is shown
 * and the request carries no executor (the server's own pool). The numbers are the same either way.
 */
import type { ExecutorChoice } from '../../../shared/contracts.js';
import type { HealthInfo } from '../api/api-client.js';
import { clear, el } from '../ui/dom.js';

const WORDS: Record<ExecutorChoice, string> = {
  queue: 'The queue: the worker machines connected to it',
  local: "This machine: the server's own cores",
};

export interface ExecutorField {
  element: HTMLElement;
  /** show the choice or nothing, from the server's health (idempotent: a kept choice survives) */
  update: (health: HealthInfo | null) => void;
  /** the chosen executor, or undefined when there is no choice (the server decides) */
  value: () => ExecutorChoice | undefined;
}

export function executorField(): ExecutorField {
  const element = el('div', { id: 'executor-choice' });
  let offered: readonly ExecutorChoice[] = [];
  let radios: HTMLInputElement[] = [];

  const update = (health: HealthInfo | null) => {
    const executors = health?.executors ?? [];
    const next = executors.length > 1 ? executors : [];
    if (next.join() === offered.join()) return;
    offered = next;
    if (next.length === 0) {
      radios = [];
      clear(element);
      return;
    }
    radios = next.map((executor, k) => el('input', { type: 'radio', name: 'executor', id: `executor-${executor}`, value: executor, checked: k === 0 }));
    clear(
      element,
      el(
        'fieldset',
        {},
        el('legend', {}, 'Where the sweep runs'),
        ...radios.map((radio) => el('div', { class: 'check-row' }, radio, el('label', { for: radio.id }, WORDS[radio.value as ExecutorChoice]))),
        el(
          'p',
          { class: 'field-hint' },
          'Both give the same numbers. A sweep on the queue waits for a worker to connect; if the queue cannot be reached, ' +
            'the sweep fails with a message naming it, and you can run it on this machine instead.',
        ),
      ),
    );
  };

  const value = (): ExecutorChoice | undefined => {
    const chosen = radios.find((radio) => radio.checked);
    return chosen === undefined ? undefined : (chosen.value as ExecutorChoice);
  };

  return { element, update, value };
}
