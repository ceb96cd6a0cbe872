// Package photo holds all work on image files: judging a file by its name,
// reading a JPEG's header (size, content hash, EXIF time, position and
// orientation) without decoding it, and preparing photos for a report
// (decode, reduce, turn upright, encode) on all cores with a cache.
//
// A file is opened only when it is a regular file within MaxFileBytes, its
// EXIF block reaches the EXIF library only after checkEXIF walked it, and a
// JPEG is decoded only when its scan count and the memory its frame needs
// are sane (decodable), so no file can hang a run or exhaust its memory.
//
// It knows nothing of surveys or reports: callers pass paths and settings.
// Building with the tag turbojpeg (cgo, libjpeg-turbo) adds a faster decoder
// and encoder for baseline 4:2:0 JPEGs.
package photo
