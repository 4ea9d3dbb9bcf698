import type { PatientLanguage } from '$lib/programme';

/**
 * The words of the QR components (QrCodes, QrReader), shared by the patient's screens (in the
 * patient's language) and the therapist's (English). Kept out of the patient catalogue so they stay
 * out of the first screen's JavaScript (only screens with QR codes load them). English is the source
 * and defines the shape: a language missing a message is a type error. Spanish: to be reviewed by a
 * native speaker, like patient-messages-es.ts.
 */
const en = {
  qrTooBig: 'This is too large for QR codes. Share the file instead.',
  qrImageAlt: (index: number, count: number, label: string) => `QR code ${index} of ${count} of the ${label}`,
  qrCaption: (index: number, count: number) => `Code ${index} of ${count}`,
  qrPrevious: 'Previous code',
  qrNext: 'Next code',
  qrDrawing: 'Drawing the QR codes…',
  qrAllRead: 'All codes read.',
  qrSomeRead: (have: number, of: number) => `${have} of ${of} codes read.${have < of ? ' Show the next code.' : ''}`,
  qrPictureUnreadable: (file: string) => `Could not read the picture ${file}.`,
  qrNoneFound: 'No QR code found in that picture. Try again, closer and in good light.',
  qrNoCamera: 'This browser cannot use the camera here. Use "Read from photos" or open the file instead.',
  qrCameraRefused: 'The camera could not be opened (permission refused or no camera). Use "Read from photos" or open the file instead.',
  qrStopCamera: 'Stop the camera',
  qrScan: 'Scan with the camera',
  qrFromPhotos: 'Read from photos',
  qrReportLabel: 'report',
  qrPointCamera: (reader: string) => `Point the camera at the code (reader: ${reader}).`,
};

export type QrMessages = { readonly [K in keyof typeof en]: (typeof en)[K] extends string ? string : (typeof en)[K] };

const es: QrMessages = {
  qrTooBig: 'Es demasiado grande para códigos QR. Comparte el archivo.',
  qrImageAlt: (index, count, label) => `Código QR ${index} de ${count} del ${label}`,
  qrCaption: (index, count) => `Código ${index} de ${count}`,
  qrPrevious: 'Código anterior',
  qrNext: 'Código siguiente',
  qrDrawing: 'Dibujando los códigos QR…',
  qrAllRead: 'Todos los códigos leídos.',
  qrSomeRead: (have, of) => `${have} de ${of} códigos leídos.${have < of ? ' Muestra el código siguiente.' : ''}`,
  qrPictureUnreadable: (file) => `No se pudo leer la imagen ${file}.`,
  qrNoneFound: 'No se encontró ningún código QR en esa imagen. Inténtalo de nuevo, más cerca y con buena luz.',
  qrNoCamera: 'Este navegador no puede usar la cámara aquí. Usa «Leer desde fotos» o abre el archivo.',
  qrCameraRefused: 'No se pudo abrir la cámara (permiso denegado o sin cámara). Usa «Leer desde fotos» o abre el archivo.',
  qrStopCamera: 'Detener la cámara',
  qrScan: 'Escanear con la cámara',
  qrFromPhotos: 'Leer desde fotos',
  qrReportLabel: 'informe',
  qrPointCamera: (reader) => `Apunta la cámara al código (lector: ${reader}).`,
};

export const QR_MESSAGES: Readonly<Record<PatientLanguage, QrMessages>> = { en, es };
