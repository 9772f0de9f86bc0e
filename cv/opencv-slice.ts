/**
 * The slice of opencv.js (@techstark/opencv-js 4.12.0-release.1, pinned in package.json)
 * that cv/ calls. Typing only what we use keeps the boundary visible: a call that is not
 * listed here is a compile error until somebody adds it on purpose.
 */

export interface Deletable {
  delete(): void;
  isDeleted(): boolean;
}

export interface Size {
  width: number;
  height: number;
}

export interface Rect {
  x: number;
  y: number;
  width: number;
  height: number;
}

export interface Mat extends Deletable {
  readonly rows: number;
  readonly cols: number;
  readonly data: Uint8Array;
  readonly data32S: Int32Array;
  readonly data32F: Float32Array;
  readonly data64F: Float64Array;
  type(): number;
  channels(): number;
  roi(rect: Rect): Mat;
  clone(): Mat;
  copyTo(dst: Mat, mask?: Mat): void;
  convertTo(dst: Mat, rtype: number, alpha?: number, beta?: number): void;
  setTo(value: Scalar, mask?: Mat): Mat;
  size(): Size;
}

export type Scalar = number[];

export interface MatVector extends Deletable {
  size(): number;
  get(i: number): Mat;
  push_back(m: Mat): void;
}

export interface MatConstructor {
  new (): Mat;
  new (rows: number, cols: number, type: number): Mat;
  new (rows: number, cols: number, type: number, scalar: Scalar): Mat;
  zeros(rows: number, cols: number, type: number): Mat;
  ones(rows: number, cols: number, type: number): Mat;
}

export interface RotatedRect {
  center: { x: number; y: number };
  size: Size;
  angle: number;
}

export interface OpenCv {
  Mat: MatConstructor;
  MatVector: new () => MatVector;
  Size: new (width: number, height: number) => Size;
  Point: new (x: number, y: number) => { x: number; y: number };
  Rect: new (x: number, y: number, width: number, height: number) => Rect;
  HEAP8: Int8Array;

  matFromImageData(image: { data: ArrayLike<number>; width: number; height: number }): Mat;
  matFromArray(rows: number, cols: number, type: number, array: ArrayLike<number>): Mat;

  cvtColor(src: Mat, dst: Mat, code: number, dstCn?: number): void;
  resize(src: Mat, dst: Mat, dsize: Size, fx?: number, fy?: number, interpolation?: number): void;
  remap(src: Mat, dst: Mat, mapX: Mat, mapY: Mat, interpolation: number, borderMode?: number): void;
  split(src: Mat, dst: MatVector): void;
  merge(src: MatVector, dst: Mat): void;
  medianBlur(src: Mat, dst: Mat, ksize: number): void;
  GaussianBlur(src: Mat, dst: Mat, ksize: Size, sigmaX: number, sigmaY?: number): void;
  blur(src: Mat, dst: Mat, ksize: Size): void;
  threshold(src: Mat, dst: Mat, thresh: number, maxval: number, type: number): number;
  absdiff(a: Mat, b: Mat, dst: Mat): void;
  subtract(a: Mat, b: Mat, dst: Mat, mask?: Mat, dtype?: number): void;
  add(a: Mat, b: Mat, dst: Mat, mask?: Mat, dtype?: number): void;
  multiply(a: Mat, b: Mat, dst: Mat, scale?: number, dtype?: number): void;
  magnitude(x: Mat, y: Mat, dst: Mat): void;
  sqrt(src: Mat, dst: Mat): void;
  bitwise_and(a: Mat, b: Mat, dst: Mat, mask?: Mat): void;
  max(a: Mat, b: Mat, dst: Mat): void;
  min(a: Mat, b: Mat, dst: Mat): void;
  bitwise_or(a: Mat, b: Mat, dst: Mat, mask?: Mat): void;
  bitwise_not(a: Mat, dst: Mat, mask?: Mat): void;
  compare(a: Mat, b: Mat, dst: Mat, cmpop: number): void;
  inRange(src: Mat, lower: Mat, upper: Mat, dst: Mat): void;
  countNonZero(src: Mat): number;
  mean(src: Mat, mask?: Mat): Scalar;
  meanStdDev(src: Mat, mean: Mat, stddev: Mat, mask?: Mat): void;
  minMaxLoc(
    src: Mat,
    mask?: Mat,
  ): {
    minVal: number;
    maxVal: number;
    minLoc: { x: number; y: number };
    maxLoc: { x: number; y: number };
  };
  getStructuringElement(shape: number, ksize: Size): Mat;
  morphologyEx(
    src: Mat,
    dst: Mat,
    op: number,
    kernel: Mat,
    anchor?: unknown,
    iterations?: number,
  ): void;
  dilate(src: Mat, dst: Mat, kernel: Mat): void;
  erode(src: Mat, dst: Mat, kernel: Mat): void;
  distanceTransform(src: Mat, dst: Mat, distanceType: number, maskSize: number): void;
  connectedComponentsWithStats(
    src: Mat,
    labels: Mat,
    stats: Mat,
    centroids: Mat,
    connectivity?: number,
    ltype?: number,
  ): number;
  connectedComponents(src: Mat, labels: Mat, connectivity?: number, ltype?: number): number;
  watershed(image: Mat, markers: Mat): void;
  Sobel(src: Mat, dst: Mat, ddepth: number, dx: number, dy: number, ksize?: number): void;
  Laplacian(src: Mat, dst: Mat, ddepth: number, ksize?: number): void;
  Canny(src: Mat, dst: Mat, t1: number, t2: number): void;
  HoughCircles(
    src: Mat,
    circles: Mat,
    method: number,
    dp: number,
    minDist: number,
    param1: number,
    param2: number,
    minRadius: number,
    maxRadius: number,
  ): void;
  fitEllipse(points: Mat): RotatedRect;
  minEnclosingCircle(points: Mat): { center: { x: number; y: number }; radius: number };
  ellipse(
    img: Mat,
    center: { x: number; y: number },
    axes: Size,
    angle: number,
    startAngle: number,
    endAngle: number,
    color: Scalar,
    thickness: number,
  ): void;
  circle(
    img: Mat,
    center: { x: number; y: number },
    radius: number,
    color: Scalar,
    thickness: number,
  ): void;
  findContours(image: Mat, contours: MatVector, hierarchy: Mat, mode: number, method: number): void;
  contourArea(contour: Mat): number;
  arcLength(curve: Mat, closed: boolean): number;
  convexHull(points: Mat, hull: Mat, clockwise?: boolean, returnPoints?: boolean): void;
  drawContours(
    image: Mat,
    contours: MatVector,
    contourIdx: number,
    color: Scalar,
    thickness: number,
  ): void;
  transform(src: Mat, dst: Mat, m: Mat): void;

  CV_8U: number;
  CV_8UC1: number;
  CV_8UC3: number;
  CV_8UC4: number;
  CV_32S: number;
  CV_32SC1: number;
  CV_32F: number;
  CV_32FC1: number;
  CV_32FC2: number;
  CV_32FC3: number;
  CV_64F: number;
  COLOR_RGBA2RGB: number;
  COLOR_RGBA2GRAY: number;
  COLOR_RGB2GRAY: number;
  COLOR_RGB2Lab: number;
  INTER_AREA: number;
  INTER_LINEAR: number;
  INTER_NEAREST: number;
  BORDER_REPLICATE: number;
  THRESH_BINARY: number;
  THRESH_BINARY_INV: number;
  THRESH_OTSU: number;
  THRESH_TOZERO: number;
  MORPH_CROSS: number;
  MORPH_ELLIPSE: number;
  MORPH_RECT: number;
  MORPH_OPEN: number;
  MORPH_CLOSE: number;
  DIST_L2: number;
  DIST_MASK_5: number;
  DIST_MASK_PRECISE: number;
  CMP_EQ: number;
  CMP_GT: number;
  CMP_GE: number;
  CMP_LE: number;
  CMP_LT: number;
  HOUGH_GRADIENT: number;
  RETR_EXTERNAL: number;
  RETR_CCOMP: number;
  CHAIN_APPROX_NONE: number;
  CHAIN_APPROX_SIMPLE: number;
  CC_STAT_LEFT: number;
  CC_STAT_TOP: number;
  CC_STAT_WIDTH: number;
  CC_STAT_HEIGHT: number;
  CC_STAT_AREA: number;
  FILLED: number;
  COLOR_RGB2HSV: number;
}
