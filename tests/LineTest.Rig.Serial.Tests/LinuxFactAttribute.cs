namespace LineTest.Rig.Serial.Tests;

/// <summary>A fact that needs real pseudo-terminal serial ports, which only Linux provides here.</summary>
public sealed class LinuxFactAttribute : FactAttribute
{
    public LinuxFactAttribute()
    {
        if (!OperatingSystem.IsLinux())
        {
            Skip = "needs Linux pseudo-terminals (posix_openpt) to stand in for serial ports";
        }
    }
}
