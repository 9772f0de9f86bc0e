declare module '@techstark/opencv-js' {
  const cv: unknown;
  export default cv;
}
