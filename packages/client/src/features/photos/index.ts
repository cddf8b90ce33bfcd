/** What this feature offers other features; everything else in the folder is private to it. */
export { FarmPhoto } from './components/farm-photo';
// A buck's photos for Stud Share's offer form (which of them his card shows) and a hand-over's photo.
export { animalPhotosQueryOptions } from './api/get-animal-photos';
export { uploadAnimalPhotos } from './api/upload-animal-photos';
