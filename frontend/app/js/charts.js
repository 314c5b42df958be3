// Chart.js (global `Chart`, from the webjar) with our defaults, the Okabe–Ito palette and small drawing plugins.

export const COLORS = {
  blue: '#0072B2', orange: '#E69F00', sky: '#56B4E9', green: '#009E73', vermillion: '#D55E00',
  purple: '#CC79A7', ink: '#22303a', muted: '#6b7780', grid: '#e4e2dc', paper: '#ffffff',
};

export function alpha(hex, a) {
  const n = parseInt(hex.slice(1), 16);
  return `rgba(${n >> 16},${(n >> 8) & 255},${n & 255},${a})`;
}

const background = {
  id: 'flBackground',
  beforeDraw(chart) {
    const { ctx, width, height } = chart;
    ctx.save();
    ctx.globalCompositeOperation = 'destination-over';
    ctx.fillStyle = COLORS.paper;
    ctx.fillRect(0, 0, width, height);
    ctx.restore();
  },
};

/** dataset.intervals: [{lower, upper}] per data point, drawn as a line with caps along the value axis. */
const intervals = {
  id: 'flIntervals',
  afterDatasetsDraw(chart) {
    const { ctx } = chart;
    const horizontal = chart.options.indexAxis === 'y';
    chart.data.datasets.forEach((ds, i) => {
      if (!ds.intervals || !chart.isDatasetVisible(i)) return;
      const meta = chart.getDatasetMeta(i);
      const scale = chart.scales[horizontal ? meta.xAxisID : meta.yAxisID];
      ctx.save();
      ctx.strokeStyle = ds.intervalColor ?? COLORS.ink;
      ctx.lineWidth = 1.5;
      // (value, across) points: the value axis is x for horizontal bars, y otherwise
      const line = (v1, c1, v2, c2) => (horizontal ? (ctx.moveTo(v1, c1), ctx.lineTo(v2, c2))
        : (ctx.moveTo(c1, v1), ctx.lineTo(c2, v2)));
      meta.data.forEach((el, j) => {
        const iv = ds.intervals[j];
        if (!iv || iv.lower === null || iv.upper === null) return;
        const [a, b] = [iv.lower, iv.upper].map((v) => scale.getPixelForValue(v));
        const c = horizontal ? el.y : el.x;
        ctx.beginPath();
        line(a, c, b, c);
        line(a, c - 4, a, c + 4);
        line(b, c - 4, b, c + 4);
        ctx.stroke();
      });
      ctx.restore();
    });
  },
};

/** options.plugins.flGuides: {bands: [{from, to, color}], lines: [{x | y, color, label, dash}]} in scale values. */
const guides = {
  id: 'flGuides',
  beforeDatasetsDraw(chart, _args, opts) {
    const { ctx, chartArea: area, scales: { x, y } } = chart;
    ctx.save();
    for (const b of opts.bands ?? []) {
      const left = Math.max(area.left, x.getPixelForValue(b.from));
      const right = Math.min(area.right, x.getPixelForValue(b.to));
      ctx.fillStyle = b.color;
      ctx.fillRect(left, area.top, Math.max(1, right - left), area.bottom - area.top);
    }
    ctx.restore();
  },
  afterDatasetsDraw(chart, _args, opts) {
    const { ctx, chartArea: area, scales } = chart;
    ctx.save();
    ctx.font = '12px system-ui, sans-serif';
    let row = 0;
    for (const l of opts.lines ?? []) {
      ctx.strokeStyle = l.color ?? COLORS.ink;
      ctx.fillStyle = l.color ?? COLORS.ink;
      ctx.lineWidth = l.width ?? 1.5;
      ctx.setLineDash(l.dash ?? [5, 4]);
      ctx.beginPath();
      if (l.x !== undefined) {
        const px = scales.x.getPixelForValue(l.x);
        if (px < area.left - 1 || px > area.right + 1) continue;
        ctx.moveTo(px, area.top); ctx.lineTo(px, area.bottom); ctx.stroke();
        if (l.label) {
          const w = ctx.measureText(l.label).width;
          label(ctx, l.label, px + 4 + w > area.right ? px - 4 - w : px + 4, area.top + 12 + 15 * (row++ % 3), ctx.fillStyle);
        }
      } else {
        const scale = scales[l.axis ?? (chart.options.indexAxis === 'y' ? 'x' : 'y')];
        const p = scale.getPixelForValue(l.y);
        if (chart.options.indexAxis === 'y') { ctx.moveTo(p, area.top); ctx.lineTo(p, area.bottom); }
        else { ctx.moveTo(area.left, p); ctx.lineTo(area.right, p); }
        ctx.stroke();
        if (l.label) {
          const w = ctx.measureText(l.label).width;
          if (chart.options.indexAxis === 'y') {
            label(ctx, l.label, p + 4 + w > area.right ? p - 4 - w : p + 4, area.bottom - 6 - 15 * (row++ % 3), ctx.fillStyle);
          } else label(ctx, l.label, area.right - w - 2, p - 5, ctx.fillStyle);
        }
      }
    }
    ctx.restore();
  },
};

/** Canvas text on a white box, readable over bars. */
function label(ctx, text, x, y, color) {
  const w = ctx.measureText(text).width;
  ctx.fillStyle = 'rgba(255,255,255,0.85)';
  ctx.fillRect(x - 2, y - 11, w + 4, 14);
  ctx.fillStyle = color;
  ctx.fillText(text, x, y);
}

let firstDrawn = false;
/** Marks the first chart drawn after navigation in the Performance timeline (docs/benchmarks.md). */
const timing = { id: 'flTiming', afterRender: () => firstDrawn || (firstDrawn = performance.mark('foldline:first-chart')) };

let registered = false;
function register() {
  if (registered) return;
  registered = true;
  const C = window.Chart;
  C.register(background, intervals, guides, timing);
  C.defaults.animation = false;
  C.defaults.font.family = 'system-ui, -apple-system, "Segoe UI", Roboto, sans-serif';
  C.defaults.color = COLORS.ink;
  C.defaults.borderColor = COLORS.grid;
  C.defaults.maintainAspectRatio = false;
  C.defaults.plugins.legend.position = 'bottom';
  C.defaults.plugins.legend.labels.boxWidth = 14;
  C.defaults.plugins.tooltip.backgroundColor = 'rgba(34,48,58,0.92)';
}

export function makeChart(canvas, config) {
  if (!window.Chart) throw new Error('the chart library did not load');
  register();
  window.Chart.getChart(canvas)?.destroy();
  return new window.Chart(canvas, config);
}

/** A small trend line without axes (tiles and site cards). */
export function sparkline(canvas, values) {
  canvas.dataset.points = String(values.length);
  return makeChart(canvas, { type: 'line', data: { labels: values.map(String), datasets: [{ data: values,
    borderColor: COLORS.blue, borderWidth: 1.5, pointRadius: 0 }] }, options: { events: [], layout: { padding: 2 },
    scales: { x: { display: false }, y: { display: false } }, plugins: { legend: { display: false } } } });
}

/** Bars on the left axis and a line on the right one, e.g. a value and how many readers stand behind it. */
export function barsAndLine({ labels, xTitle, bar, line, extra = [], lines = [] }) {
  const axis = (a, position) => ({ position, beginAtZero: true, title: { display: true, text: a.label },
    ticks: { callback: a.format }, grid: { drawOnChartArea: position === 'left' } });
  return {
    data: { labels, datasets: [
      { type: 'bar', label: bar.label, data: bar.data, backgroundColor: bar.color },
      { type: 'line', label: line.label, data: line.data, borderColor: line.color, backgroundColor: line.color,
        pointRadius: 3, yAxisID: 'y1' },
      ...extra] },
    options: {
      scales: { x: { title: { display: true, text: xTitle } }, y: axis(bar, 'left'), y1: axis(line, 'right') },
      plugins: { flGuides: { lines }, tooltip: { callbacks: {
        label: (c) => `${c.dataset.label}: ${(c.dataset.yAxisID === 'y1' ? line : bar).format(c.parsed.y)}` } } },
    },
  };
}
