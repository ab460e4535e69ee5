/** Photo building blocks shared by swaps (block photos) and chat (photo messages). */
export { PhotoUploader } from './photo-uploader';
export { PhotoGallery, type GalleryPhoto } from './photo-gallery';
export {
  blockPhotosQueryOptions,
  blockPhotosUrl,
  deletePhoto,
  fetchBlockPhotos,
  photoKeys,
  uploadPhotos,
  useBlockPhotos,
  useDeletePhoto,
  type UploadProgress,
} from './api';
