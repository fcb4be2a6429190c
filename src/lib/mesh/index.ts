// Uploaded meshes: reading a file of element centroids. Every export is named here; tests/mesh/index.test.ts pins the list.
export { parseMeshCsv, MESH_ELEMENTS_MAX, MESH_FILE_BYTES_MAX, MESH_LABEL_MAX } from './parse-mesh';
export type { MeshMapping, ParsedMesh } from './parse-mesh';
export { previewMesh } from './preview-mesh';
export type { MeshPreview } from './preview-mesh';
