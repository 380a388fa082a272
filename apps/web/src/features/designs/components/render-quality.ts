/**
 * Whether WebGL here is drawn in software (no GPU: SwiftShader, llvmpipe and the like). There every pixel of
 * the preview costs CPU time shared with the page, so the preview draws without multisampling and at one
 * pixel per CSS pixel; with a GPU it keeps antialiasing and the screen's pixel ratio. Asked once, through
 * a throwaway context; an unknown renderer counts as hardware.
 */
let software: boolean | null = null;

const SOFTWARE_RENDERERS = /swiftshader|llvmpipe|softpipe|software|basic render/i;

export function isSoftwareWebGl(): boolean {
  if (software !== null) return software;
  software = false;
  try {
    const canvas = document.createElement('canvas');
    const gl = canvas.getContext('webgl2') ?? canvas.getContext('webgl');
    if (gl) {
      const info = gl.getExtension('WEBGL_debug_renderer_info');
      const renderer = String(
        info ? gl.getParameter(info.UNMASKED_RENDERER_WEBGL) : gl.getParameter(gl.RENDERER),
      );
      software = SOFTWARE_RENDERERS.test(renderer);
      gl.getExtension('WEBGL_lose_context')?.loseContext();
    }
  } catch {
    software = false;
  }
  return software;
}
