/** runTool: the one way media tools run as child processes; failures come back as sentences, never hang. */
import { describe, expect, it } from 'vitest'
import { MediaToolError, runTool } from '../../../server/media/run-tool'

// ffmpeg's lavfi sine source as endless raw audio on stdout: a child that would never end by itself
const ENDLESS_AUDIO = ['-nostdin', '-v', 'error', '-f', 'lavfi', '-i', 'sine=frequency=440', '-f', 's16le', 'pipe:1']

describe('runTool', () => {
  it('should say how to install a tool that is missing', async () => {
    const running = runTool('gridcue-no-such-recogniser', [], { installHint: 'Install it with apt-get.' })
    await expect(running).rejects.toBeInstanceOf(MediaToolError)
    await expect(running).rejects.toThrow('gridcue-no-such-recogniser is not installed on this server. Install it with apt-get.')
  })

  it('should end the child and pass the error on when the stdout consumer throws', async () => {
    const running = runTool('ffmpeg', ENDLESS_AUDIO, {
      onStdout: () => {
        throw new Error('the consumer gave up')
      },
    })
    await expect(running).rejects.toThrow('the consumer gave up')
  })

  it('should end the child when aborted', async () => {
    const controller = new AbortController()
    const running = runTool('ffmpeg', ENDLESS_AUDIO, { signal: controller.signal, onStdout: () => controller.abort(new Error('cancelled')) })
    await expect(running).rejects.toThrow('cancelled')
  })

  it('should explain a failure with the tool’s own last words', async () => {
    const running = runTool('ffmpeg', ['-nostdin', '-v', 'error', '-i', '/nonexistent/recording.webm', '-f', 'null', '-'])
    await expect(running).rejects.toThrow(/^ffmpeg failed \(exit 1\): .*No such file or directory/)
  })
})
