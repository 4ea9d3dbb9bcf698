import { durationWords, type DosePart } from '$lib/programme';

/**
 * Every word a patient reads on their own phone, in each language the phone speaks. English is the
 * source; `PatientMessages` is its shape, so a message missing from another language (or taking
 * other arguments) is a type error at build time. Messages with numbers are functions, so each
 * language makes its own plurals and word order.
 *
 * Why a catalogue written here rather than Paraglide JS: see DEVELOPERS.md ("Patient languages").
 * Spanish: written by a non-native speaker, to be reviewed by a native speaker before release.
 */
const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

const en = {
  languageName: 'English',
  languageChoice: 'Language',
  // Menu and frame
  navToday: 'Today',
  navWeek: 'My week',
  navFeel: 'How I feel',
  navSend: 'Send report',
  navReminders: 'Reminders',
  skipToContent: 'Skip to content',
  leaveLink: 'Stop using this phone for my programme',
  therapistDevice: "These screens are for a patient's own phone. This device is set up for a therapist: hand a programme over from the patient's page instead.",
  caution: 'Stop an exercise that causes pain, and tell your therapist. If you feel unwell or have new weakness, numbness or severe spasms, get medical help. Kinnote keeps your log on this phone only; it gives no medical advice.',
  opening: 'Opening…',
  // First screen
  welcome: 'Welcome to Kinnote',
  welcomeLede: 'Outcome records for therapists, and the home programme for their patients, on this device only.',
  patientChoiceTitle: 'I follow a home programme',
  patientChoiceText: 'Your therapist gives you a file or QR codes and a code. This phone then shows your exercises and keeps your log. It holds only your own programme.',
  receiveButton: 'Receive my programme',
  offlineReady: 'Kinnote is ready to work offline on this device.',
  openingProgramme: 'Opening your home programme…',
  // Receive
  receiveTitle: 'Get my programme',
  receiveLede: 'Your therapist sends you a file, or shows QR codes, and tells you a code of 10 letters and digits.',
  receiveStep1: '1. The programme',
  receiveOpenFile: 'Open the programme file',
  receiveOrQr: 'Or read QR codes',
  receiveQrNoPhotos: 'QR codes carry the text of your programme only, without photos. Ask for the file to see the photos.',
  receiveReady: (source: string) => `Ready: ${source}`,
  receiveQrSource: 'QR codes',
  receiveStep2: '2. The code',
  receiveCodeLabel: 'Code from your therapist',
  receiveOpenButton: 'Open my programme',
  receiveOpeningButton: 'Opening… (this takes a few seconds)',
  receiveNoFile: 'First open the programme file, or read its QR codes.',
  receiveNotPatientPhone: "This device is not set up as a patient's own phone.",
  receiveDone: (title: string) => `Your programme "${title}" is on this phone.`,
  receiveSame: (title: string) => `You already have this programme ("${title}"); nothing changed.`,
  receiveGoToday: "Go to today's exercises",
  // Today
  homeTitle: 'Your home programme',
  homeNothingYet: 'No programme on this phone yet. Your therapist gives you a file or QR codes, and a code.',
  todayTitle: 'Today',
  logDamaged: 'Your earlier ticks could not be read on this phone. New ticks are saved as usual.',
  dueReminder: (time: string, left: number) => `Reminder for ${time}: ${plural(left, 'exercise', 'exercises')} still to tick today.`,
  nothingToday: 'No exercises are planned for today.',
  thisWeekCount: (done: number, planned: number) => `This week: ${done} of ${planned} done`,
  timeOfToday: (slot: number, slots: number) => `Time ${slot} of ${slots} today`,
  todayLegend: 'Today',
  photoAlt: (position: number, count: number, exercise: string) => `Photo ${position} of ${count}: ${exercise}`,
  saved: 'Saved.',
  cleared: 'Cleared.',
  asWritten: 'As your therapist wrote it:',
  // Ticks
  tickDone: '✓ Done',
  tickPartly: '◐ Partly',
  tickSkipped: '✗ Skipped',
  whySkipped: 'Why? (it helps your therapist)',
  reasonPain: 'Pain',
  reasonTired: 'Too tired',
  reasonUnwell: 'Unwell',
  reasonNoTime: 'No time',
  reasonNoHelp: 'No help available',
  otherReason: 'Other reason',
  saveReason: 'Save reason',
  // How I feel (Penn Spasm Frequency Scale, Penn et al. 1989, in plain words)
  feelTitle: 'How are your spasms today?',
  feelHowOften: 'How often did you have spasms today?',
  penn0: '0 — No spasms',
  penn1: '1 — Only when something sets them off (touch, moving)',
  penn2: '2 — Now and then, less than once an hour',
  penn3: '3 — More than once an hour',
  penn4: '4 — More than ten times an hour',
  feelHowBad: 'How bad were they? 0 = none, 10 = worst you can imagine',
  feelSave: 'Save',
  feelChooseOne: 'Choose at least one answer.',
  feelSaved: 'Saved for today. You can change it again today.',
  // Send
  sendTitle: 'Send my report',
  sendLede: 'Your report holds your ticks and how your spasms felt. It is locked with a new code: tell your therapist the code yourself (say it or write it down), not in the same message as the file.',
  sendMaking: 'Making the report… (a few seconds)',
  sendMakeNew: 'Make a new report',
  sendMake: 'Make my report',
  sendYourCode: 'Your code:',
  sendShare: 'Share or save the report',
  sendHideQr: 'Hide QR codes',
  sendShowQr: 'Show QR codes for my therapist to scan',
  sendShareTitle: 'My home programme report',
  sendSent: 'Sent.',
  sendSavedAs: (file: string) => `Saved as ${file}. Send this file to your therapist.`,
  // Week
  weekTitle: 'My week',
  weekGetFirst: 'Get your programme first.',
  todaySuffix: ' (today)',
  notInProgramme: 'Not in your programme',
  nothingTicked: 'Nothing ticked',
  dayTicks: (done: number, partly: number, skipped: number) => `✓ ${done} done${partly ? ` · ◐ ${partly} partly` : ''}${skipped ? ` · ✗ ${skipped} skipped` : ''}`,
  weekByWeek: 'Week by week',
  weekLine: (week: string, done: number, planned: number) => `Week of ${week}: ${planned > 0 ? `${done} of ${planned} done (${Math.round((100 * done) / planned)} %)` : 'nothing to count this week'}`,
  notStarted: 'Your programme has not started yet.',
  olderWeeks: (n: number) => `Older weeks (${n})`,
  // Reminders
  remindersTitle: 'Reminders',
  willDoLabel: 'What this phone will do:',
  willDo: 'while Kinnote is open on the screen, it shows a notification at each time below (if you allow notifications), and the Today screen shows what is still to tick after a reminder time has passed.',
  willNotLabel: 'What it will not do:',
  willNot: "remind you when Kinnote is closed, when the phone is asleep, or reliably when another app is in front. A web app cannot wake itself, and Kinnote uses no server that could send reminders. For a reminder you can count on, set an alarm in your phone's clock app.",
  notificationsUnsupported: 'This browser cannot show reminders. Set an alarm on your phone for your exercise times instead.',
  notificationsDenied: "Reminders are blocked for Kinnote in this browser's settings. Allow notifications there, or set an alarm on your phone.",
  notificationsAsk: 'Kinnote needs your permission to show reminders.',
  notificationsAllowed: 'Reminders are allowed.',
  remindCheckbox: 'Remind me at these times while Kinnote is open',
  reminderTime: (i: number) => `Time ${i}`,
  addTime: 'Add a time',
  removeLastTime: 'Remove the last time',
  saveReminders: 'Save reminders',
  testReminder: 'Send a test reminder',
  testReminderText: 'This is how a reminder looks.',
  testReminderSent: 'A test reminder was sent.',
  remindersSaved: (withNotification: boolean) =>
    `Saved. Kinnote will remind you at these times only while it is open on your screen${withNotification ? ' (with a notification)' : ' (on the Today screen; notifications are not allowed)'}.`,
  remindersOff: 'Reminders are off.',
  reminderNotice: 'Time for your home exercises.',
  // Leave
  leaveTitle: 'Stop using this phone for my programme',
  leaveRemoves: 'This removes from this phone, for good:',
  leaveProgrammes: (n: number) => `your programme${n > 1 ? 's' : ''}:`,
  leavePhotos: (n: number) => `the exercise photos: ${n}`,
  leaveTicks: (ticks: number, days: number) => `your ticks: ${ticks} (${plural(days, 'day', 'days')} with exercises done)`,
  leaveRatings: (n: number) => `your spasm ratings: ${n}`,
  leaveReminders: 'your reminder times',
  leaveTherapistKeeps: 'Your therapist keeps only what you already sent.',
  leaveSendFirst: 'Send a report first',
  leaveSendFirstAfter: 'if you have not sent your latest ticks.',
  leaveConfirm: 'I understand: remove all of this from this phone',
  leaveButton: 'Remove and leave patient mode',
  leaveRemoving: 'Removing…',
  leaveReading: 'Reading what is on this phone…',
  leaveKeep: 'Keep my programme and go back',
  // Dose words
  dosePart: (part: DosePart): string => {
    switch (part.kind) {
      case 'hold':
        return `hold ${part.seconds} s`;
      case 'repetitions':
        return plural(part.count, 'repetition', 'repetitions');
      case 'sets':
        return plural(part.count, 'set', 'sets');
      case 'duration':
        return `${durationWords(part.minutes)} each time`;
      case 'overnight':
        return 'overnight';
      case 'times-per-day':
        return `${plural(part.count, 'time', 'times')} a day`;
      case 'days-per-week':
        return `on ${plural(part.count, 'day', 'days')} a week`;
      case 'every-day':
        return 'every day';
    }
  },
};

/** The shape every language fills: the same keys, strings where English has strings, the same functions. */
export type PatientMessages = { readonly [K in keyof typeof en]: (typeof en)[K] extends string ? string : (typeof en)[K] };

// Spanish (neutral, "tú" form, as patient leaflets in Spain and Latin America commonly use). To be
// reviewed by a native speaker.
const es: PatientMessages = {
  languageName: 'Español',
  languageChoice: 'Idioma',
  navToday: 'Hoy',
  navWeek: 'Mi semana',
  navFeel: 'Cómo me siento',
  navSend: 'Enviar informe',
  navReminders: 'Avisos',
  skipToContent: 'Ir al contenido',
  leaveLink: 'Dejar de usar este teléfono para mi programa',
  therapistDevice: 'Estas pantallas son para el teléfono propio de un paciente. Este dispositivo está configurado para un terapeuta: entrega el programa desde la página del paciente.',
  caution: 'Deja un ejercicio si te causa dolor y díselo a tu terapeuta. Si te encuentras mal o notas debilidad nueva, entumecimiento o espasmos fuertes, busca ayuda médica. Kinnote guarda tu registro solo en este teléfono; no da consejos médicos.',
  opening: 'Abriendo…',
  welcome: 'Te damos la bienvenida a Kinnote',
  welcomeLede: 'Registros de evolución para terapeutas y el programa en casa para sus pacientes, solo en este dispositivo.',
  patientChoiceTitle: 'Sigo un programa en casa',
  patientChoiceText: 'Tu terapeuta te da un archivo o códigos QR, y un código. Después, este teléfono te muestra tus ejercicios y guarda tu registro. Solo contiene tu propio programa.',
  receiveButton: 'Recibir mi programa',
  offlineReady: 'Kinnote está listo para funcionar sin conexión en este dispositivo.',
  openingProgramme: 'Abriendo tu programa en casa…',
  receiveTitle: 'Recibir mi programa',
  receiveLede: 'Tu terapeuta te envía un archivo, o te muestra códigos QR, y te dice un código de 10 letras y números.',
  receiveStep1: '1. El programa',
  receiveOpenFile: 'Abrir el archivo del programa',
  receiveOrQr: 'O leer códigos QR',
  receiveQrNoPhotos: 'Los códigos QR solo llevan el texto de tu programa, sin fotos. Pide el archivo para ver las fotos.',
  receiveReady: (source: string) => `Listo: ${source}`,
  receiveQrSource: 'códigos QR',
  receiveStep2: '2. El código',
  receiveCodeLabel: 'Código de tu terapeuta',
  receiveOpenButton: 'Abrir mi programa',
  receiveOpeningButton: 'Abriendo… (tarda unos segundos)',
  receiveNoFile: 'Primero abre el archivo del programa o lee sus códigos QR.',
  receiveNotPatientPhone: 'Este dispositivo no está configurado como el teléfono propio de un paciente.',
  receiveDone: (title: string) => `Tu programa «${title}» ya está en este teléfono.`,
  receiveSame: (title: string) => `Ya tienes este programa («${title}»); no ha cambiado nada.`,
  receiveGoToday: 'Ir a los ejercicios de hoy',
  homeTitle: 'Tu programa en casa',
  homeNothingYet: 'Todavía no hay ningún programa en este teléfono. Tu terapeuta te da un archivo o códigos QR, y un código.',
  todayTitle: 'Hoy',
  logDamaged: 'No se han podido leer tus marcas anteriores en este teléfono. Las nuevas se guardan como siempre.',
  dueReminder: (time: string, left: number) => `Aviso de las ${time}: ${left === 1 ? 'te queda 1 ejercicio' : `te quedan ${left} ejercicios`} por marcar hoy.`,
  nothingToday: 'Hoy no hay ejercicios previstos.',
  thisWeekCount: (done: number, planned: number) => `Esta semana: ${done} de ${planned} hechos`,
  timeOfToday: (slot: number, slots: number) => `Vez ${slot} de ${slots} hoy`,
  todayLegend: 'Hoy',
  photoAlt: (position: number, count: number, exercise: string) => `Foto ${position} de ${count}: ${exercise}`,
  saved: 'Guardado.',
  cleared: 'Borrado.',
  asWritten: 'Tal como lo escribió tu terapeuta:',
  tickDone: '✓ Hecho',
  tickPartly: '◐ En parte',
  tickSkipped: '✗ No lo hice',
  whySkipped: '¿Por qué? (ayuda a tu terapeuta)',
  reasonPain: 'Dolor',
  reasonTired: 'Demasiado cansancio',
  reasonUnwell: 'Me encontraba mal',
  reasonNoTime: 'Sin tiempo',
  reasonNoHelp: 'Nadie pudo ayudarme',
  otherReason: 'Otro motivo',
  saveReason: 'Guardar el motivo',
  feelTitle: '¿Cómo están hoy tus espasmos?',
  feelHowOften: '¿Con qué frecuencia has tenido espasmos hoy?',
  penn0: '0 — Ningún espasmo',
  penn1: '1 — Solo cuando algo los provoca (un roce, un movimiento)',
  penn2: '2 — De vez en cuando, menos de una vez por hora',
  penn3: '3 — Más de una vez por hora',
  penn4: '4 — Más de diez veces por hora',
  feelHowBad: '¿Cómo de fuertes fueron? 0 = nada, 10 = lo peor que puedas imaginar',
  feelSave: 'Guardar',
  feelChooseOne: 'Elige al menos una respuesta.',
  feelSaved: 'Guardado para hoy. Puedes cambiarlo otra vez durante el día.',
  sendTitle: 'Enviar mi informe',
  sendLede: 'Tu informe contiene tus marcas y cómo te sentiste con los espasmos. Va cerrado con un código nuevo: díselo tú a tu terapeuta (en voz alta o por escrito), no en el mismo mensaje que el archivo.',
  sendMaking: 'Preparando el informe… (unos segundos)',
  sendMakeNew: 'Preparar un informe nuevo',
  sendMake: 'Preparar mi informe',
  sendYourCode: 'Tu código:',
  sendShare: 'Compartir o guardar el informe',
  sendHideQr: 'Ocultar los códigos QR',
  sendShowQr: 'Mostrar códigos QR para que los lea mi terapeuta',
  sendShareTitle: 'Informe de mi programa en casa',
  sendSent: 'Enviado.',
  sendSavedAs: (file: string) => `Guardado como ${file}. Envía este archivo a tu terapeuta.`,
  weekTitle: 'Mi semana',
  weekGetFirst: 'Primero recibe tu programa.',
  todaySuffix: ' (hoy)',
  notInProgramme: 'No está en tu programa',
  nothingTicked: 'Nada marcado',
  dayTicks: (done: number, partly: number, skipped: number) => `✓ ${done} ${done === 1 ? 'hecho' : 'hechos'}${partly ? ` · ◐ ${partly} en parte` : ''}${skipped ? ` · ✗ ${skipped} sin hacer` : ''}`,
  weekByWeek: 'Semana a semana',
  weekLine: (week: string, done: number, planned: number) => `Semana del ${week}: ${planned > 0 ? `${done} de ${planned} hechos (${Math.round((100 * done) / planned)} %)` : 'nada que contar esta semana'}`,
  notStarted: 'Tu programa todavía no ha empezado.',
  olderWeeks: (n: number) => `Semanas anteriores (${n})`,
  remindersTitle: 'Avisos',
  willDoLabel: 'Lo que hará este teléfono:',
  willDo: 'mientras Kinnote esté abierto en la pantalla, mostrará una notificación a cada hora de abajo (si permites las notificaciones), y la pantalla Hoy mostrará lo que te queda por marcar cuando haya pasado la hora de un aviso.',
  willNotLabel: 'Lo que no hará:',
  willNot: 'avisarte cuando Kinnote esté cerrado, cuando el teléfono esté en reposo, ni de forma fiable cuando otra aplicación esté delante. Una aplicación web no puede despertarse sola, y Kinnote no usa ningún servidor que pueda enviar avisos. Para un aviso con el que puedas contar, pon una alarma en el reloj del teléfono.',
  notificationsUnsupported: 'Este navegador no puede mostrar avisos. Pon una alarma en el teléfono para las horas de tus ejercicios.',
  notificationsDenied: 'Los avisos de Kinnote están bloqueados en los ajustes de este navegador. Permite allí las notificaciones o pon una alarma en el teléfono.',
  notificationsAsk: 'Kinnote necesita tu permiso para mostrar avisos.',
  notificationsAllowed: 'Los avisos están permitidos.',
  remindCheckbox: 'Avisarme a estas horas mientras Kinnote esté abierto',
  reminderTime: (i: number) => `Hora ${i}`,
  addTime: 'Añadir una hora',
  removeLastTime: 'Quitar la última hora',
  saveReminders: 'Guardar los avisos',
  testReminder: 'Enviar un aviso de prueba',
  testReminderText: 'Así se ve un aviso.',
  testReminderSent: 'Se ha enviado un aviso de prueba.',
  remindersSaved: (withNotification: boolean) =>
    `Guardado. Kinnote te avisará a estas horas solo mientras esté abierto en tu pantalla${withNotification ? ' (con una notificación)' : ' (en la pantalla Hoy; las notificaciones no están permitidas)'}.`,
  remindersOff: 'Los avisos están desactivados.',
  reminderNotice: 'Es la hora de tus ejercicios en casa.',
  leaveTitle: 'Dejar de usar este teléfono para mi programa',
  leaveRemoves: 'Esto borra de este teléfono, para siempre:',
  leaveProgrammes: (n: number) => `${n > 1 ? 'tus programas' : 'tu programa'}:`,
  leavePhotos: (n: number) => `las fotos de los ejercicios: ${n}`,
  leaveTicks: (ticks: number, days: number) => `tus marcas: ${ticks} (${days === 1 ? '1 día' : `${days} días`} con ejercicios hechos)`,
  leaveRatings: (n: number) => `tus valoraciones de espasmos: ${n}`,
  leaveReminders: 'las horas de tus avisos',
  leaveTherapistKeeps: 'Tu terapeuta solo conserva lo que ya le enviaste.',
  leaveSendFirst: 'Envía antes un informe',
  leaveSendFirstAfter: 'si no has enviado tus últimas marcas.',
  leaveConfirm: 'Lo entiendo: borrar todo esto de este teléfono',
  leaveButton: 'Borrar y salir del modo paciente',
  leaveRemoving: 'Borrando…',
  leaveReading: 'Leyendo lo que hay en este teléfono…',
  leaveKeep: 'Conservar mi programa y volver',
  dosePart: (part: DosePart): string => {
    switch (part.kind) {
      case 'hold':
        return `mantener ${part.seconds} s`;
      case 'repetitions':
        return plural(part.count, 'repetición', 'repeticiones');
      case 'sets':
        return plural(part.count, 'serie', 'series');
      case 'duration':
        return `${durationWords(part.minutes)} cada vez`;
      case 'overnight':
        return 'durante la noche';
      case 'times-per-day':
        return `${plural(part.count, 'vez', 'veces')} al día`;
      case 'days-per-week':
        return `${plural(part.count, 'día', 'días')} a la semana`;
      case 'every-day':
        return 'todos los días';
    }
  },
};

export const PATIENT_LANGUAGES = ['en', 'es'] as const;
export type PatientLanguage = (typeof PATIENT_LANGUAGES)[number];

export const PATIENT_MESSAGES: Readonly<Record<PatientLanguage, PatientMessages>> = { en, es };

export function isPatientLanguage(value: unknown): value is PatientLanguage {
  return typeof value === 'string' && (PATIENT_LANGUAGES as readonly string[]).includes(value);
}
