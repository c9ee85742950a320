import { afterEach, describe, expect, it, vi } from 'vitest'
import { render } from '@testing-library/vue'
import WaveSurfer from 'wavesurfer.js'
import RegionsPlugin from 'wavesurfer.js/dist/plugins/regions.esm.js'
import type { Region } from 'wavesurfer.js/dist/plugins/regions.esm.js'
import RecordingWaveform from '@/components/RecordingWaveform.vue'
import type { WaveformMarker } from '@/components/RecordingWaveform.vue'
import { settle } from './render'

const peaks = { durationMs: 90_000, perSecond: 10, peaks: Array.from({ length: 900 }, (_, i) => Math.abs(Math.sin(i / 20))) }
const markers: WaveformMarker[] = [
  { lineId: 3, startMs: 1_500, label: '1', chosen: false },
  { lineId: 4, startMs: 6_200, label: '2', chosen: true },
]

/** The real wavesurfer and Regions plugin, watched: the test sees what the wrapper asks of them. */
function watchWavesurfer() {
  const create = vi.spyOn(WaveSurfer, 'create')
  const plugins: ReturnType<typeof RegionsPlugin.create>[] = []
  const realCreate = RegionsPlugin.create.bind(RegionsPlugin)
  vi.spyOn(RegionsPlugin, 'create').mockImplementation(() => {
    const plugin = realCreate()
    plugins.push(plugin)
    return plugin
  })
  return { create, regions: () => plugins[plugins.length - 1].getRegions() }
}

function mount(props: Partial<{ markers: WaveformMarker[]; trim: { inMs: number; outMs?: number } }> = {}) {
  const media = document.createElement('audio')
  media.src = 'blob:take-one'
  document.body.append(media)
  return { media, ...render(RecordingWaveform, { props: { peaks, media, url: 'blob:take-one', markers, ...props } }) }
}

describe('RecordingWaveform', () => {
  afterEach(() => vi.restoreAllMocks())

  it('should draw the server’s peaks over the given element without decoding the file, and put one end-less mark per line', async () => {
    const surfer = watchWavesurfer()
    const { media } = mount()
    await settle()

    expect(surfer.create).toHaveBeenCalledOnce()
    const options = surfer.create.mock.calls[0][0]
    expect(options).toMatchObject({ media, url: 'blob:take-one', peaks: [peaks.peaks], duration: 90 })
    // the element keeps the source it was given
    expect(media.getAttribute('src')).toBe('blob:take-one')
    const placed = surfer.regions().map((r: Region) => ({ id: r.id, start: r.start, end: r.end, drag: r.drag }))
    expect(placed).toEqual([
      { id: '3', start: 1.5, end: 1.5, drag: true },
      { id: '4', start: 6.2, end: 6.2, drag: true },
    ])
  })

  it('should report a dragged mark as a line and a start in milliseconds, then show the marks the lines say', async () => {
    const surfer = watchWavesurfer()
    const { emitted } = mount()
    await settle()
    const dragged = surfer.regions()[1]

    dragged.setOptions({ start: 7.25 })
    // what the plugin hears when a drag ends (wavesurfer.js regions: the region's "update-end")
    ;(dragged as unknown as { emit(event: string): void }).emit('update-end')
    await settle()

    expect(emitted().move).toEqual([[4, 7250]])
    // nobody moved line 4 in the outline, so its mark goes back
    expect(surfer.regions().map((r: Region) => r.start)).toEqual([1.5, 6.2])
  })

  it('should shade the recording outside the video’s cut, fixed in place, and follow a changed cut', async () => {
    const surfer = watchWavesurfer()
    const { rerender } = mount({ trim: { inMs: 2_000, outMs: 80_000 } })
    await settle()
    const shaded = () => surfer.regions().filter((r: Region) => r.id.startsWith('cut-')).map((r: Region) => ({ start: r.start, end: r.end, drag: r.drag, resize: r.resize }))
    expect(shaded()).toEqual([
      { start: 0, end: 2, drag: false, resize: false },
      { start: 80, end: 90, drag: false, resize: false },
    ])

    await rerender({ trim: { inMs: 5_000 } })
    expect(shaded()).toEqual([{ start: 0, end: 5, drag: false, resize: false }])
    await rerender({ trim: undefined })
    expect(shaded()).toEqual([])
  })

  it('should move the marks when the lines change', async () => {
    const surfer = watchWavesurfer()
    const { rerender } = mount()
    await settle()

    await rerender({ markers: [{ ...markers[0], startMs: 2_000 }] })

    expect(surfer.regions().map((r: Region) => [r.id, r.start])).toEqual([['3', 2]])
  })
})
