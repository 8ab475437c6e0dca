using Newtonsoft.Json;
using ScaleGen.Model;

namespace ScaleGen.Bench;

/// <summary>
/// The yardstick for the front end: the same points written as a plain JSON list and read
/// back with Newtonsoft.Json into plain objects. Reading JSON checks nothing and resolves
/// nothing, so it is a floor for what reading a plant can cost.
/// </summary>
public static class JsonBaseline
{
    public sealed class PointDto
    {
        public string Tag { get; set; } = "";
        public string Description { get; set; } = "";
        public string Card { get; set; } = "";
        public string Address { get; set; } = "";
        public double SignalLow { get; set; }
        public double SignalHigh { get; set; }
        public double? Shunt { get; set; }
        public double Lrv { get; set; }
        public double Urv { get; set; }
        public string Unit { get; set; } = "";
        public bool SquareRoot { get; set; }
        public double Cutoff { get; set; }
        public string Health { get; set; } = "";
        public double? FaultLow { get; set; }
        public double? FaultHigh { get; set; }
        public string OnFault { get; set; } = "";
        public double OnFaultValue { get; set; }
        public double Filter { get; set; }
        public string Measure { get; set; } = "";
        public double Tolerance { get; set; }
        public List<AlarmDto> Alarms { get; set; } = new();
        public LoopDto? Loop { get; set; }
    }

    public sealed class AlarmDto
    {
        public string Kind { get; set; } = "";
        public double Setpoint { get; set; }
        public double Deadband { get; set; }
        public double Delay { get; set; }
        public double Clear { get; set; }
        public int Priority { get; set; }
        public string? Text { get; set; }
    }

    public sealed class LoopDto
    {
        public double Supply { get; set; }
        public double Device { get; set; }
        public double? CableLength { get; set; }
        public string? Conductor { get; set; }
        public double Barrier { get; set; }
        public double Extra { get; set; }
        public bool Hart { get; set; }
        public double Current { get; set; }
    }

    /// <summary>The plant's points as indented JSON, as a person would keep such a file.</summary>
    public static string Write(Plant plant) =>
        JsonConvert.SerializeObject(plant.Points.Select(ToDto).ToList(), Formatting.Indented);

    public static List<PointDto> Read(string json) =>
        JsonConvert.DeserializeObject<List<PointDto>>(json) ?? throw new InvalidOperationException("empty JSON");

    private static PointDto ToDto(Point p) => new()
    {
        Tag = p.Tag,
        Description = p.Description,
        Card = p.Card.Name,
        Address = p.Address,
        SignalLow = p.SignalLowMa,
        SignalHigh = p.SignalHighMa,
        Shunt = p.ShuntOhms,
        Lrv = p.Lrv,
        Urv = p.Urv,
        Unit = p.Unit,
        SquareRoot = p.SquareRoot,
        Cutoff = p.CutoffPercent,
        Health = p.Health.Kind.ToString(),
        FaultLow = p.Health.FaultLowMa,
        FaultHigh = p.Health.FaultHighMa,
        OnFault = p.OnFault.Kind.ToString(),
        OnFaultValue = p.OnFault.Value,
        Filter = p.FilterSeconds,
        Measure = p.Measure.ToString(),
        Tolerance = p.TolerancePercent,
        Alarms = p.Alarms.Select(a => new AlarmDto
        {
            Kind = a.Kind.ToString(),
            Setpoint = a.Setpoint,
            Deadband = a.Deadband,
            Delay = a.OnDelaySeconds,
            Clear = a.OffDelaySeconds,
            Priority = a.Priority,
            Text = a.Message,
        }).ToList(),
        Loop = p.Loop is not { } loop ? null : new LoopDto
        {
            Supply = loop.SupplyVolts,
            Device = loop.DeviceVolts,
            CableLength = loop.CableLengthMetres,
            Conductor = loop.Conductor?.ToString(),
            Barrier = loop.BarrierOhms,
            Extra = loop.ExtraOhms,
            Hart = loop.Hart,
            Current = loop.CurrentMa,
        },
    };
}
