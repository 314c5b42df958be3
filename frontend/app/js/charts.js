// Chart.js (global `Chart`, from the webjar) with our defaults, the Okabe–Ito palette and small drawing plugins.

// COLORS.blue + 'cc': the same colour, translucent
export const COLORS = {
  blue: '#0072B2', orange: '#E69F00', sky: '#56B4E9', green: '#009E73', vermillion: '#D55E00',
  purple: '#CC79A7', ink: '#22303a', muted: '#6b7780', paper: '#ffffff',
};

// white behind the chart, so that a PNG export is not transparent
const background = { id: 'flBackground', beforeDraw({ ctx, width, height }) {
  ctx.save();
  ctx.globalCompositeOperation = 'destination-over';
  ctx.fillStyle = COLORS.paper;
  ctx.fillRect(0, 0, width, height);
  ctx.restore();
} };

const intervals = { id: 'flIntervals', afterDatasetsDraw(chart) {
  const { ctx } = chart;
  const across = chart.options.indexAxis === 'y';
  chart.data.datasets.forEach((ds, i) => {
    if (!ds.intervals || !chart.isDatasetVisible(i)) return;
    const meta = chart.getDatasetMeta(i);
    const scale = chart.scales[across ? meta.xAxisID : meta.yAxisID];
    ctx.save();
    ctx.strokeStyle = ds.intervalColor ?? COLORS.ink;
    ctx.lineWidth = 1.5;
    const line = (v1, c1, v2, c2) => (across ? (ctx.moveTo(v1, c1), ctx.lineTo(v2, c2))
      : (ctx.moveTo(c1, v1), ctx.lineTo(c2, v2)));
    meta.data.forEach((el, j) => {
      const iv = ds.intervals[j];
      if (iv?.[0] == null || iv[1] == null) return;
      const [a, b] = iv.map((v) => scale.getPixelForValue(v));
      const c = across ? el.y : el.x;
      ctx.beginPath();
      line(a, c, b, c);
      line(a, c - 4, a, c + 4);
      line(b, c - 4, b, c + 4);
      ctx.stroke();
    });
    ctx.restore();
  });
} };

const guides = {
  id: 'flGuides',
  beforeDatasetsDraw({ ctx, chartArea: a, scales: { x } }, _args, opts) {
    for (const b of opts.bands ?? []) {
      const left = Math.max(a.left, x.getPixelForValue(b.from));
      ctx.fillStyle = b.color;
      ctx.fillRect(left, a.top, Math.max(1, Math.min(a.right, x.getPixelForValue(b.to)) - left), a.bottom - a.top);
    }
  },
  afterDatasetsDraw(chart, _args, opts) {
    const { ctx, chartArea: a, scales } = chart;
    const across = chart.options.indexAxis === 'y';
    ctx.save();
    ctx.font = '12px system-ui, sans-serif';
    (opts.lines ?? []).forEach((l, row) => {
      const vertical = l.x !== undefined || across;
      const p = l.x !== undefined ? scales.x.getPixelForValue(l.x) : scales[across ? 'x' : 'y'].getPixelForValue(l.y);
      if (vertical && (p < a.left - 1 || p > a.right + 1)) return;
      ctx.strokeStyle = ctx.fillStyle = l.color ?? COLORS.ink;
      ctx.lineWidth = 1.5;
      ctx.setLineDash(l.dash ?? [5, 4]);
      ctx.beginPath();
      ctx.moveTo(vertical ? p : a.left, vertical ? a.top : p);
      ctx.lineTo(vertical ? p : a.right, vertical ? a.bottom : p);
      ctx.stroke();
      if (!l.label) return;
      const w = ctx.measureText(l.label).width;
      const [tx, ty] = !vertical ? [a.right - w - 2, p - 5]
        : [p + 4 + w > a.right ? p - 4 - w : p + 4, l.x !== undefined ? a.top + 12 + 15 * (row % 3)
          : a.bottom - 6 - 15 * (row % 3)];
      ctx.fillStyle = 'rgba(255,255,255,0.85)';
      ctx.fillRect(tx - 2, ty - 11, w + 4, 14);
      ctx.fillStyle = l.color ?? COLORS.ink;
      ctx.fillText(l.label, tx, ty);
    });
    ctx.restore();
  },
};

let firstDrawn = false;
let registered = false;
// the first chart drawn after navigation, in the Performance timeline (docs/benchmarks.md)
const timing = { id: 'flTiming', afterRender: () => firstDrawn ||= performance.mark('foldline:first-chart') };

export function makeChart(canvas, config) {
  const C = window.Chart;
  if (!C) throw new Error('the chart library did not load');
  if (!registered) {
    registered = true;
    C.register(background, intervals, guides, timing);
    Object.assign(C.defaults, { animation: false, color: COLORS.ink, borderColor: '#e4e2dc',
      maintainAspectRatio: false });
    C.defaults.font.family = 'system-ui, -apple-system, "Segoe UI", Roboto, sans-serif';
    C.defaults.plugins.legend.position = 'bottom';
    C.defaults.plugins.legend.labels.boxWidth = 14;
  }
  C.getChart(canvas)?.destroy();
  return new C(canvas, config);
}

export const axis = (text) => ({ title: { display: true, text } });

export function sparkline(canvas, values) {
  canvas.dataset.points = values.length;
  return makeChart(canvas, { type: 'line', data: { labels: values, datasets: [{ data: values,
    borderColor: COLORS.blue, borderWidth: 1.5, pointRadius: 0 }] }, options: { events: [], layout: { padding: 2 },
    scales: { x: { display: false }, y: { display: false } }, plugins: { legend: { display: false } } } });
}

export function barsAndLine({ labels, xTitle, bar, line, extra = [], lines = [] }) {
  const side = (a, position) => ({ ...axis(a.label), position, beginAtZero: true, ticks: { callback: a.format },
    grid: { drawOnChartArea: position === 'left' } });
  return {
    data: { labels, datasets: [
      { type: 'bar', label: bar.label, data: bar.data, backgroundColor: bar.color },
      { type: 'line', label: line.label, data: line.data, borderColor: line.color, backgroundColor: line.color,
        pointRadius: 3, yAxisID: 'y1' },
      ...extra] },
    options: {
      scales: { x: axis(xTitle), y: side(bar, 'left'), y1: side(line, 'right') },
      plugins: { flGuides: { lines }, tooltip: { callbacks: {
        label: (c) => `${c.dataset.label}: ${(c.dataset.yAxisID ? line : bar).format(c.parsed.y)}` } } },
    },
  };
}
