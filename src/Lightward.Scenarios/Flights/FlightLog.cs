using System.Text;
using Lightward.Scenarios.Model;
using Lightward.Spacetime;

namespace Lightward.Scenarios.Flights;

/// <summary>
/// The flight log format, version 1 (little-endian): the magic bytes "LWFLIGHT", a u16 version, the scenario's
/// SHA-256 (32 bytes), its seed (u64), the fixed step (f64), the scenario path and the pilot's description
/// (each a u16 byte count and UTF-8). Then records: 'S' = a run of steps with the same requested controls
/// (7-bit varint count, f64 duration, f64 thrust x y z, f64 attitude rate x y z); 'R' = the pilot started a new
/// run of the flight (see <see cref="Flight.BeginRun"/>); 'E' = the end of the flight (32-byte state hash, u8 success). Records are only ever appended; a log cut short by a crash ends in at most
/// one torn record, which readers ignore.
/// </summary>
public static class FlightLogFormat
{
    public static readonly byte[] Magic = "LWFLIGHT"u8.ToArray();
    public const ushort Version = 1;
    public const byte StepsRecord = (byte)'S';
    public const byte EndRecord = (byte)'E';
    public const byte RunRecord = (byte)'R';
    public const string Extension = ".flightlog";
}

/// <summary>A run of steps flown under the same requested controls; a count of zero marks a new run of the flight.</summary>
public readonly record struct StepRun(long Count, double Duration, Controls Controls)
{
    public static readonly StepRun NewRun = new(0, 0, Controls.Coast);
}

/// <summary>A flight log as read back.</summary>
public sealed record FlightLog(
    string Path, string ScenarioHash, ulong Seed, double Step, string ScenarioPath, string Pilot,
    IReadOnlyList<StepRun> Runs, string? FinalStateHash, bool? Success, bool Truncated)
{
    public static FlightLog Read(string path)
    {
        byte[] bytes = Files.UserFiles.ReadBytes(path, "flight log");
        using var reader = new BinaryReader(new MemoryStream(bytes), Encoding.UTF8);
        try
        {
            if (bytes.Length < FlightLogFormat.Magic.Length || !bytes.AsSpan(0, FlightLogFormat.Magic.Length).SequenceEqual(FlightLogFormat.Magic))
                throw new UserInputException($"{path}: not a flight log (it does not start with the flight log header)");
            reader.ReadBytes(FlightLogFormat.Magic.Length);
            ushort version = reader.ReadUInt16();
            if (version != FlightLogFormat.Version)
                throw new UserInputException($"{path}: flight log version {version} is not supported (this program reads version {FlightLogFormat.Version})");
            string scenarioHash = Convert.ToHexStringLower(reader.ReadBytes(32));
            ulong seed = reader.ReadUInt64();
            double step = reader.ReadDouble();
            string scenarioPath = ReadText(reader), pilot = ReadText(reader);
            var runs = new List<StepRun>();
            string? finalHash = null;
            bool? success = null;
            bool truncated = false;
            while (reader.BaseStream.Position < bytes.Length && finalHash is null)
            {
                long start = reader.BaseStream.Position;
                try
                {
                    byte tag = reader.ReadByte();
                    if (tag == FlightLogFormat.StepsRecord)
                    {
                        long count = reader.Read7BitEncodedInt64();
                        double duration = reader.ReadDouble();
                        var thrust = new Vec3(reader.ReadDouble(), reader.ReadDouble(), reader.ReadDouble());
                        var rate = new Vec3(reader.ReadDouble(), reader.ReadDouble(), reader.ReadDouble());
                        if (count <= 0 || !(duration > 0) || !double.IsFinite(duration) || !thrust.IsFinite || !rate.IsFinite)
                            throw new UserInputException($"{path}: damaged step record at byte {start}");
                        runs.Add(new StepRun(count, duration, new Controls(thrust, rate)));
                    }
                    else if (tag == FlightLogFormat.RunRecord) runs.Add(StepRun.NewRun);
                    else if (tag == FlightLogFormat.EndRecord)
                    {
                        byte[] hash = reader.ReadBytes(32);
                        if (hash.Length < 32) throw new EndOfStreamException();
                        finalHash = Convert.ToHexStringLower(hash);
                        success = reader.ReadByte() != 0;
                    }
                    else throw new UserInputException($"{path}: unknown record type 0x{tag:x2} at byte {start}");
                }
                catch (EndOfStreamException)
                {
                    // A crash can leave one record half-written; everything before it stands.
                    finalHash = null;
                    success = null;
                    truncated = true;
                    break;
                }
            }
            return new FlightLog(path, scenarioHash, seed, step, scenarioPath, pilot, runs, finalHash, success, truncated);
        }
        catch (Exception exception) when (exception is EndOfStreamException or FormatException)
        {
            throw new UserInputException($"{path}: the flight log header is damaged or cut short");
        }
    }

    private static string ReadText(BinaryReader reader)
    {
        int length = reader.ReadUInt16();
        byte[] text = reader.ReadBytes(length);
        if (text.Length < length) throw new EndOfStreamException();
        return new UTF8Encoding(false, true).GetString(text);
    }
}

/// <summary>
/// Appends a flight's requested controls to a flight log as it flies. Steps with the same controls and duration
/// are gathered into one record; whatever is gathered is written and flushed at least once a second of wall time
/// (from a thread of its own, so a paused live flight is flushed too), so a crash loses at most the last second.
/// Thread-safe: a live window host may record from its loop thread while the timer flushes.
/// </summary>
public sealed class FlightRecorder : IDisposable
{
    private readonly object _gate = new();
    private readonly FileStream _stream;
    private readonly BinaryWriter _writer;
    // A thread of its own, not a pool timer: a busy thread pool must not delay the once-a-second flush.
    private readonly Thread _flusher;
    private readonly ManualResetEventSlim _stopFlushing = new();
    private StepRun? _pending;
    private bool _closed;

    private FlightRecorder(string path, Scenario scenario, string pilot)
    {
        Path = path;
        try
        {
            _stream = new FileStream(path, FileMode.CreateNew, FileAccess.Write, FileShare.Read);
        }
        catch (Exception exception) when (exception is IOException or UnauthorizedAccessException)
        {
            throw new UserInputException($"{path}: cannot create flight log: {exception.Message}");
        }
        _writer = new BinaryWriter(_stream, Encoding.UTF8);
        _writer.Write(FlightLogFormat.Magic);
        _writer.Write(FlightLogFormat.Version);
        _writer.Write(Convert.FromHexString(scenario.ContentHash));
        _writer.Write(scenario.Seed);
        _writer.Write(scenario.Flight.Step);
        WriteText(scenario.SourcePath);
        WriteText(pilot);
        _writer.Flush();
        _flusher = new Thread(FlushEverySecond) { IsBackground = true, Name = "flight log flush" };
        _flusher.Start();
    }

    public string Path { get; }

    /// <summary>The log name a flight gets when the user names none: the scenario and the UTC time, in the current folder.</summary>
    public static string DefaultPath(Scenario scenario) =>
        $"{scenario.Name}-{DateTime.UtcNow.ToString("yyyyMMdd'T'HHmmss'Z'", System.Globalization.CultureInfo.InvariantCulture)}{FlightLogFormat.Extension}";

    /// <summary>Starts a new log at <paramref name="path"/> (which must not exist yet) for a flight of <paramref name="scenario"/>.</summary>
    /// <param name="pilot">Who flies: "autopilot", "plan &lt;file&gt;", "live", for the reader's information.</param>
    public static FlightRecorder Create(string path, Scenario scenario, string pilot) => new(path, scenario, pilot);

    /// <summary>Records one step's requested controls; call before or after flying it, once per step.</summary>
    public void Record(Controls requested, double duration)
    {
        lock (_gate)
        {
            if (_closed) throw new InvalidOperationException("the flight log is closed");
            if (_pending is { } run && run.Duration == duration && run.Controls == requested)
                _pending = run with { Count = run.Count + 1 };
            else
            {
                WritePending();
                _pending = new StepRun(1, duration, requested);
            }
        }
    }

    /// <summary>Marks that the pilot started a new run of the flight (<see cref="Flight.BeginRun"/>).</summary>
    public void RecordRunStart()
    {
        lock (_gate)
        {
            if (_closed) throw new InvalidOperationException("the flight log is closed");
            WritePending();
            _writer.Write(FlightLogFormat.RunRecord);
        }
    }

    private void FlushEverySecond()
    {
        while (!_stopFlushing.Wait(TimeSpan.FromSeconds(1))) Flush();
    }

    /// <summary>Writes what is gathered and hands it to the operating system.</summary>
    public void Flush()
    {
        lock (_gate)
        {
            if (_closed) return;
            WritePending();
            _writer.Flush();
        }
    }

    /// <summary>Ends the log with the final state hash and the verdict, and closes it.</summary>
    public void Finish(string stateHash, bool success)
    {
        lock (_gate)
        {
            if (_closed) return;
            WritePending();
            _writer.Write(FlightLogFormat.EndRecord);
            _writer.Write(Convert.FromHexString(stateHash));
            _writer.Write((byte)(success ? 1 : 0));
            Close();
        }
    }

    public void Dispose()
    {
        lock (_gate)
        {
            if (_closed) return;
            WritePending();
            Close();
        }
    }

    private void Close()
    {
        _closed = true;
        _stopFlushing.Set();
        _writer.Flush();
        _writer.Dispose();
    }

    private void WritePending()
    {
        if (_pending is not { } run) return;
        _writer.Write(FlightLogFormat.StepsRecord);
        _writer.Write7BitEncodedInt64(run.Count);
        _writer.Write(run.Duration);
        Vec3 a = run.Controls.ProperAcceleration, w = run.Controls.AttitudeRate;
        _writer.Write(a.X); _writer.Write(a.Y); _writer.Write(a.Z);
        _writer.Write(w.X); _writer.Write(w.Y); _writer.Write(w.Z);
        _pending = null;
    }

    private void WriteText(string text)
    {
        byte[] bytes = Encoding.UTF8.GetBytes(text);
        if (bytes.Length > ushort.MaxValue) bytes = bytes[..ushort.MaxValue];
        _writer.Write((ushort)bytes.Length);
        _writer.Write(bytes);
    }
}
