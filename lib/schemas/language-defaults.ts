import { DEFAULT_CONSENT, DESIGN_DEFAULTS, type Language } from '@/lib/schemas/study.schema';

// The editable respondent texts' starting values per language: the consent text and the
// attention check. The builder offers them when the analyst picks a language (a text the
// analyst changed is kept). Each consent text makes the same promises as the English one,
// and only those the code keeps: no names or e-mail addresses, answers under a random number,
// voluntary, stop at any time, deletion on request (tests/integration/respondent-data-protection.test.ts;
// the fixed promises with the retention period are in the respondent catalogues, respondent/messages).

export const DEFAULT_CONSENTS: Record<Language, string> = {
  en: DEFAULT_CONSENT,
  de:
    'Diese kurze Umfrage gehört zu einer Preisstudie eines Händlers. Sie sehen Preise und beantworten ein paar schnelle Fragen; ' +
    'es gibt keine richtigen oder falschen Antworten. Das dauert nur wenige Minuten. Wir fragen nicht nach Ihrem Namen oder Ihrer E-Mail-Adresse, ' +
    'und Ihre Antworten werden unter einer zufälligen Nummer gespeichert. Die Teilnahme ist freiwillig, und Sie können jederzeit aufhören; ' +
    'bis dahin gegebene Antworten können für die Studie verwendet werden, außer Sie verlangen, dass sie gelöscht werden.',
  fr:
    'Cette courte enquête fait partie d’une étude sur les prix menée par un distributeur. Vous verrez des prix et répondrez à quelques questions rapides ; ' +
    'il n’y a pas de bonne ou de mauvaise réponse. Cela prend quelques minutes. Nous ne demandons ni votre nom ni votre adresse e-mail, ' +
    'et vos réponses sont enregistrées sous un numéro tiré au hasard. La participation est libre et vous pouvez arrêter à tout moment ; ' +
    'les réponses déjà données peuvent être gardées pour l’étude, sauf si vous demandez leur suppression.',
  es:
    'Esta breve encuesta forma parte de un estudio de precios de un comercio. Verá precios y responderá a unas preguntas rápidas; ' +
    'no hay respuestas buenas ni malas. Se tarda unos minutos. No le pedimos su nombre ni su correo electrónico, ' +
    'y sus respuestas se guardan con un número al azar. Participar es voluntario y puede dejarlo en cualquier momento; ' +
    'las respuestas dadas hasta entonces pueden usarse en el estudio, salvo que pida que se borren.',
  nl:
    'Deze korte vragenlijst hoort bij een prijsonderzoek van een winkelketen. U ziet prijzen en beantwoordt een paar korte vragen; ' +
    'er zijn geen goede of foute antwoorden. Het duurt een paar minuten. We vragen niet naar uw naam of e-mailadres, ' +
    'en uw antwoorden worden onder een willekeurig nummer bewaard. Meedoen is vrijwillig en u kunt op elk moment stoppen; ' +
    'antwoorden die u tot dan hebt gegeven, kunnen voor het onderzoek worden gebruikt, tenzij u vraagt ze te verwijderen.',
};

export interface AttentionDefaults { question: string; options: string[]; correct: string }

export const DEFAULT_ATTENTION: Record<Language, AttentionDefaults> = {
  en: { ...DESIGN_DEFAULTS.attentionCheck, options: [...DESIGN_DEFAULTS.attentionCheck.options] },
  de: { question: 'Um zu zeigen, dass Sie aufmerksam lesen, wählen Sie bitte „Oft“.', options: ['Nie', 'Manchmal', 'Oft', 'Immer'], correct: 'Oft' },
  fr: { question: 'Pour montrer que vous lisez attentivement, choisissez « Souvent ».', options: ['Jamais', 'Parfois', 'Souvent', 'Toujours'], correct: 'Souvent' },
  es: { question: 'Para mostrar que lee con atención, elija «A menudo».', options: ['Nunca', 'A veces', 'A menudo', 'Siempre'], correct: 'A menudo' },
  nl: { question: 'Kies „Vaak” om te laten zien dat u goed leest.', options: ['Nooit', 'Soms', 'Vaak', 'Altijd'], correct: 'Vaak' },
};

/** Whether `text` is one of the standard consent texts (so switching language may replace it). */
export const isDefaultConsent = (text: string) => Object.values(DEFAULT_CONSENTS).some((d) => d.trim() === text.trim());

/** Whether an attention check is still one of the standard ones (question, answers and right answer unchanged). */
export function isDefaultAttention(a: { question?: string; options?: string[]; correct?: string }): boolean {
  return Object.values(DEFAULT_ATTENTION).some((d) => d.question === a.question?.trim() && d.correct === a.correct && JSON.stringify(d.options) === JSON.stringify(a.options?.map((o) => o.trim())));
}
