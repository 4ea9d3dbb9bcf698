import type { DoseField, DoseProblem } from '$lib/domain';
import { durationWords, type DosePart, type ProgrammeTransferErrorCode } from '$lib/programme';
import { plural, type PatientMessages } from './patient-messages';

// Spanish (neutral, "tú" form, as patient leaflets in Spain and Latin America commonly use). To be
// reviewed by a native speaker.
export const SPANISH_MESSAGES: PatientMessages = {
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
  storeFailed: (why) => `No se pudieron abrir los datos de este teléfono: ${why}`,
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
  beforeArrival: 'Antes de que tu programa llegara a este teléfono',
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
  receiveRefused: (code: ProgrammeTransferErrorCode): string => {
    switch (code) {
      case 'WrongCode':
        return 'Este código no abre el archivo del programa (o el archivo se ha modificado). Un código tiene 10 letras y números, como 7KQ2M-XD4PH: revísalo y escríbelo de nuevo. No se ha guardado nada.';
      case 'Tampered':
        return 'El archivo del programa se ha modificado o está incompleto, así que se ha rechazado. No se ha guardado nada. Pide a tu terapeuta que lo envíe de nuevo.';
      case 'NotThisKind':
        return 'Esto no es un archivo de programa de tu terapeuta. No se ha guardado nada.';
      case 'Unsupported':
        return 'Este programa se hizo con una versión más nueva de Kinnote. Actualiza la aplicación y ábrelo de nuevo. No se ha guardado nada.';
      case 'Invalid':
        return 'No se puede leer el archivo del programa. No se ha guardado nada. Pide a tu terapeuta que lo envíe de nuevo.';
      case 'ForeignPatient':
        return 'Este programa es de otra persona, o este teléfono sigue el programa de otra persona. Se ha rechazado; no se ha guardado nada.';
      case 'Incomplete':
        return 'Los códigos escaneados no encajan (se leyó mal un código). Escanéalos todos de nuevo.';
    }
  },
  receiveDoseRefused: (exercise: number, field: string | null, problem: string) =>
    `No se puede usar este programa: ejercicio ${exercise}${field ? `, ${field}` : ''}: ${problem}. No se ha guardado nada. Pide a tu terapeuta un programa corregido.`,
  doseField: (field: DoseField): string => {
    switch (field) {
      case 'repetitions':
        return 'repeticiones';
      case 'sets':
        return 'series';
      case 'holdSeconds':
        return 'mantener';
      case 'durationMinutes':
        return 'minutos cada vez';
      case 'overnight':
        return 'durante la noche';
      case 'timesPerDay':
        return 'veces al día';
      case 'daysPerWeek':
        return 'días a la semana';
      case 'note':
        return 'nota';
    }
  },
  doseProblem: (p: DoseProblem): string => {
    switch (p.code) {
      case 'wholeNumber':
        return 'debe ser un número entero';
      case 'atLeast':
        return `debe ser como mínimo ${p.min}`;
      case 'atMost':
        return `debe ser como máximo ${p.max}`;
      case 'noteTooLong':
        return `debe tener como máximo ${p.max} caracteres`;
      case 'overnightOnceADay':
        return '«durante la noche» es una vez al día: «veces al día» debe quedar vacío o en 1';
      case 'nothingPrescribed':
        return 'la dosis no indica nada (ningún valor ni nota)';
    }
  },
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
